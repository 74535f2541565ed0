import { z } from 'zod'
import { EmailSchema } from './auth'

/** `POST /teams/:teamId/rounds/:roundId/results/email`: where the organisers read their mail. */
export const ResultsEmailBodySchema = z.strictObject({ to: EmailSchema })
export type ResultsEmailBody = z.infer<typeof ResultsEmailBodySchema>

/** The answer: the message went to the mail server, with the CSV attached. */
export const ResultsEmailResponseSchema = z.object({ sent: z.object({ to: z.string(), filename: z.string(), rows: z.number().int() }) })
export type ResultsEmailResponse = z.infer<typeof ResultsEmailResponseSchema>

/** A file name from words: "Kestrel Quay Open", "Heat 1" → "kestrel-quay-open-heat-1-results.csv". */
export function resultsFileName(...words: string[]): string {
  const slug = words.join(' ').normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80)
  return `${slug || 'round'}-results.csv`
}
