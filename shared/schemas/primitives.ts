import { z } from 'zod'

// The building blocks every schema of the project shares: ids, and text that a database can store.

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/**
 * A UUID, as text. Ids compare case-insensitively everywhere: they are lower-cased as they are read,
 * so `A1…` and `a1…` name the same record and never make a second row.
 */
export const IdSchema = z.string({ error: 'is not an id' }).regex(uuidPattern, 'is not an id').transform(id => id.toLowerCase())

/**
 * Why a text cannot be stored, or null when it can. A lone UTF-16 surrogate is not a character (no
 * UTF-8 encoding exists, so MariaDB's JSON check fails on it) and a NUL or other control character
 * is never typed on purpose; tab, line feed and carriage return are kept.
 */
export function textProblem(value: string): string | null {
  for (let i = 0; i < value.length; i++) {
    const code = value.charCodeAt(i)
    if (code >= 0xD800 && code <= 0xDBFF) {
      const next = value.charCodeAt(i + 1)
      if (next >= 0xDC00 && next <= 0xDFFF) {
        i++
        continue
      }
      return 'holds a broken character (a lone UTF-16 surrogate)'
    }
    if (code >= 0xDC00 && code <= 0xDFFF)
      return 'holds a broken character (a lone UTF-16 surrogate)'
    if (code === 0)
      return 'holds a NUL character'
    if ((code < 0x20 && code !== 0x09 && code !== 0x0A && code !== 0x0D) || code === 0x7F)
      return 'holds a control character'
  }
  return null
}

/** Any text: refused when it holds a character no database stores (see textProblem). */
export function storableText(): z.ZodString {
  return z.string({ error: 'must be text' }).check((ctx) => {
    const problem = textProblem(ctx.value)
    if (problem)
      ctx.issues.push({ code: 'custom', message: problem, input: ctx.value })
  })
}

/** Trimmed free text of at most `max` characters; may be empty. */
export const freeText = (max: number) => storableText().trim().max(max, `must be at most ${max} characters`)

/** A trimmed name: at least one character, at most `max`. */
export const nameText = (max = 120) => storableText().trim().min(1, 'must not be empty').max(max, `must be at most ${max} characters`)
