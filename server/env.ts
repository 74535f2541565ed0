import { z } from 'zod'
import { isLoopback } from './loopback'

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
  JWT_SECRET: z.string({ error: 'is required: at least 32 random bytes, base64url-encoded' })
    .regex(/^[\w-]+$/, 'must be base64url-encoded')
    .refine(value => Buffer.from(value, 'base64url').length >= 32, 'must hold at least 32 random bytes (43 base64url characters or more)'),
  PUBLIC_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
})

export type Env = z.infer<typeof EnvSchema> & { PUBLIC_URL: string }

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
  const host = result.data.HOST.includes(':') ? `[${result.data.HOST}]` : result.data.HOST
  return {
    ...result.data,
    DATABASE_URL: result.data.DATABASE_URL.replace(/^mariadb:/, 'mysql:'),
    PUBLIC_URL: result.data.PUBLIC_URL ?? `http://${host}:${result.data.PORT}/`,
  }
}

/**
 * The development mail listing (`/api/v1/dev/mail`) shows reset and invitation links, so it is
 * served only where nobody but the person at this machine can reach it: outside production, and
 * while the app listens on loopback.
 */
export function servesDevMail(env: Pick<Env, 'NODE_ENV' | 'HOST'>): boolean {
  return env.NODE_ENV !== 'production' && isLoopback(env.HOST)
}
