import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { z } from 'zod'

const SecretsSchema = z.object({
  dbPassword: z.string().min(16),
  jwtSecret: z.string().min(43),
})

export type Secrets = z.infer<typeof SecretsSchema>

/**
 * Per-installation secrets, made on first run with 32 random bytes each and kept in
 * `DATA_DIR/secrets.json` (mode 600) so that a restart keeps sessions and the database user.
 */
export function loadOrCreateSecrets(dataDir: string): Secrets {
  const file = path.join(dataDir, 'secrets.json')
  if (existsSync(file)) {
    const parsed = SecretsSchema.safeParse(JSON.parse(readFileSync(file, 'utf8')))
    if (parsed.success)
      return parsed.data
  }
  const secrets: Secrets = {
    dbPassword: randomBytes(32).toString('base64url'),
    jwtSecret: randomBytes(32).toString('base64url'),
  }
  mkdirSync(dataDir, { recursive: true })
  writeFileSync(file, `${JSON.stringify(secrets, null, 2)}\n`, { mode: 0o600 })
  return secrets
}
