import { z } from 'zod'

const port = z.coerce.number().int().min(1).max(65535)

/** Everything the server reads from the environment, parsed once at boot. */
export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(8080),
  DATABASE_URL: z.url({ protocol: /^mysql$|^mariadb$/, error: 'must be a mysql:// or mariadb:// URL' }),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port.default(2526),
  MAIL_FROM: z.string().min(3).default('Lixivia <no-reply@lixivia.test>'),
  DATA_DIR: z.string().min(1).default('.data'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  BODY_LIMIT: z.string().regex(/^\d+(?:b|kb|mb)$/i, 'must look like 512kb or 2mb').default('1mb'),
})

export type Env = z.infer<typeof EnvSchema>

/** Thrown when the environment is unusable; its message names every bad variable. */
export class ConfigError extends Error {
  override name = 'ConfigError'
}

/**
 * Parses an environment (process.env by default). `mariadb://` is accepted as a synonym of
 * `mysql://` and normalised, since mysql2 only knows the latter.
 */
export function parseEnv(source: Record<string, string | undefined> = process.env): Env {
  const result = EnvSchema.safeParse(source)
  if (!result.success) {
    const lines = result.error.issues.map(issue => `  ${issue.path.join('.') || '(root)'}: ${issue.message}`)
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`)
  }
  return { ...result.data, DATABASE_URL: result.data.DATABASE_URL.replace(/^mariadb:/, 'mysql:') }
}
