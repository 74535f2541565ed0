import { createHash, randomBytes } from 'node:crypto'

/** 32 random bytes as 43 characters of base64url: refresh tokens, reset and invitation links. */
export const newToken = (): string => randomBytes(32).toString('base64url')

/** Only this hash is stored; a leaked table cannot be replayed. */
export const hashToken = (token: string): string => createHash('sha256').update(token).digest('hex')
