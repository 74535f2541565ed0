/** The same words with a capital first letter, to start a sentence with a name or a method. */
export const capital = (words: string): string => words.charAt(0).toUpperCase() + words.slice(1)
