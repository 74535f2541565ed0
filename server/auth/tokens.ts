import type { JWTPayload } from 'jose'
import { randomUUID } from 'node:crypto'
import { jwtVerify, SignJWT } from 'jose'
import { HttpError } from '../http-error'

/** Access tokens carry this `typ` (RFC 9068) so no other JWT kind can pass for one (RFC 8725 §3.11). */
export const accessTokenType = 'at+jwt'
export const accessTokenIssuer = 'lixivia'
export const accessTokenAudience = 'lixivia-api'
const algorithm = 'HS256'
/** A token may say it was issued this far in the future (clocks drift); beyond, it was not made here. */
const issuedAtSkewSeconds = 60

export interface AccessTokens {
  sign: (userId: string) => Promise<string>
  /** The user id of a valid token; an HttpError 401 for anything else. */
  verify: (token: string) => Promise<string>
  ttlSeconds: number
}

/**
 * Decodes the signing secret from base64url and insists on at least 32 bytes (HS256 wants a key as
 * long as its hash).
 */
export function decodeSigningKey(secret: string): Uint8Array {
  const key = new Uint8Array(Buffer.from(secret, 'base64url'))
  if (key.length < 32)
    throw new Error('JWT_SECRET must hold at least 32 random bytes, base64url-encoded (43 characters or more).')
  return key
}

/** The one place access tokens are made and checked: algorithm pinned, iss, aud, sub, exp required, iat not in the future. */
export function createAccessTokens(secret: string, ttlSeconds = 15 * 60): AccessTokens {
  const key = decodeSigningKey(secret)
  const unauthenticated = (): HttpError => new HttpError(401, 'unauthenticated', 'Your session has ended. Sign in again.')
  return {
    ttlSeconds,
    sign: userId => new SignJWT({})
      .setProtectedHeader({ alg: algorithm, typ: accessTokenType })
      .setSubject(userId)
      .setIssuer(accessTokenIssuer)
      .setAudience(accessTokenAudience)
      .setIssuedAt()
      .setExpirationTime(`${ttlSeconds}s`)
      .setJti(randomUUID())
      .sign(key),
    async verify(token) {
      let payload: JWTPayload
      try {
        ({ payload } = await jwtVerify(token, key, {
          algorithms: [algorithm],
          issuer: accessTokenIssuer,
          audience: accessTokenAudience,
          typ: accessTokenType,
          // jose checks exp only when present: require it, and the subject.
          requiredClaims: ['exp', 'sub', 'iat'],
          clockTolerance: 5,
        }))
      }
      catch {
        throw unauthenticated()
      }
      if (typeof payload.sub !== 'string' || payload.sub.length === 0)
        throw unauthenticated()
      // jose checks iat only against a maximum age, never that it lies in the past.
      if (typeof payload.iat !== 'number' || payload.iat > Date.now() / 1000 + issuedAtSkewSeconds)
        throw unauthenticated()
      return payload.sub
    },
  }
}
