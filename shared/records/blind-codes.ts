// Blind codes for competition cups: short, random, and read aloud or off a label without doubt.

/**
 * The characters a code is made of: no 0/O/Q/D-like pairs, no 1/I/L, no 2/Z, 5/S, 6/G, 8/B, and no
 * vowels, so a code never spells a word. 18 characters: 4 of them give 104,976 codes.
 */
export const blindCodeAlphabet = 'CFHJKMNPRTVWXY3479'
export const blindCodeLength = 4

/** Fills the array with random bytes; the Web Crypto API's getRandomValues in browsers and Node. */
export type RandomBytes = (bytes: Uint8Array) => Uint8Array

const webCrypto: RandomBytes = bytes => crypto.getRandomValues(bytes)

/** A code as typed, as the app writes it: capitals, no spaces or dashes. */
export const normalizeCode = (text: string): string => text.replace(/[\s-]/g, '').toUpperCase()

/** Whether a text is a code this app could have made (any case; spaces and dashes ignored). */
export function isBlindCode(text: string): boolean {
  const code = normalizeCode(text)
  return code.length === blindCodeLength && [...code].every(character => blindCodeAlphabet.includes(character))
}

/**
 * A new random blind code that none of `taken` uses (compared without case). Each character is
 * drawn uniformly: bytes of 252 and above are drawn again, as 252 is the largest multiple of 18.
 * @param taken - the codes already used in the event
 * @param random - a source of random bytes (the Web Crypto API by default)
 */
export function newBlindCode(taken: Iterable<string>, random: RandomBytes = webCrypto): string {
  const used = new Set([...taken].map(normalizeCode))
  const limit = 256 - (256 % blindCodeAlphabet.length)
  for (let attempt = 0; attempt < 1000; attempt++) {
    let code = ''
    while (code.length < blindCodeLength) {
      for (const byte of random(new Uint8Array(blindCodeLength - code.length))) {
        if (byte < limit)
          code += blindCodeAlphabet[byte % blindCodeAlphabet.length]
      }
    }
    if (!used.has(code))
      return code
  }
  throw new Error('No free blind code could be drawn: the event holds nearly every code there is.')
}

/**
 * Several new codes at once, unique among themselves and against `taken`.
 * @param count - how many cups need a code
 */
export function newBlindCodes(count: number, taken: Iterable<string>, random: RandomBytes = webCrypto): string[] {
  const used = [...taken]
  const made: string[] = []
  for (let i = 0; i < count; i++) {
    const code = newBlindCode(used, random)
    used.push(code)
    made.push(code)
  }
  return made
}
