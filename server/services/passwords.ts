import { hash, verify } from '@node-rs/argon2'

/**
 * argon2id at OWASP's minimum recommendation (19 MiB, 2 iterations, 1 lane). @node-rs/argon2
 * defaults to argon2id; the parameters are pinned so a library upgrade cannot weaken them.
 */
const params = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const

export const hashPassword = (password: string): Promise<string> => hash(password, params)

export async function verifyPassword(stored: string, password: string): Promise<boolean> {
  try {
    return await verify(stored, password)
  }
  catch {
    return false
  }
}
