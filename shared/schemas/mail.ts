import { z } from 'zod'

/** A message caught by the local fake SMTP server (development and tests only). */
export const StoredMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().optional(),
  /** Files sent with it; the content as base64, as it travelled. */
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), size: z.number(), content: z.string() })).default([]),
})

export type StoredMail = z.infer<typeof StoredMailSchema>
