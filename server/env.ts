import { isIP } from 'node:net'
import { z } from 'zod'
import { isLoopback } from './loopback'

const port = z.coerce.number().int().min(1).max(65535)
const flag = z.enum(['true', 'false', '1', '0', 'yes', 'no'], { error: 'must be true or false' }).transform(value => ['true', '1', 'yes'].includes(value))
const setting = z.string().trim().min(1).optional()

/** Names Express's proxy-addr understands besides addresses and CIDR ranges. */
const proxyNames = new Set(['loopback', 'linklocal', 'uniquelocal'])
function isProxyAddress(entry: string): boolean {
  const [address, bits, extra] = entry.split('/')
  if (extra !== undefined || !address)
    return false
  if (bits === undefined)
    return proxyNames.has(address) || isIP(address) !== 0
  const max = isIP(address) === 4 ? 32 : isIP(address) === 6 ? 128 : 0
  return max > 0 && /^\d+$/.test(bits) && Number(bits) <= max
}

/**
 * Which peers may tell the app a client's address (X-Forwarded-For) and scheme: none by default,
 * since a client talking to the app directly could otherwise pick its own address, and with it its
 * rate-limit bucket. `npm run serve` sets it to the address Caddy connects from.
 */
const trustProxy = z.string().trim().optional().transform((value, ctx) => {
  if (!value || ['false', 'none', 'off'].includes(value))
    return false as const
  const entries = value.split(',').map(entry => entry.trim()).filter(Boolean)
  const bad = entries.find(entry => !isProxyAddress(entry))
  if (bad) {
    ctx.issues.push({ code: 'custom', input: value, message: `"${bad}" is not an address, a CIDR range or one of loopback, linklocal, uniquelocal (or set false)` })
    return z.NEVER
  }
  return entries
})

/** Everything the server reads from the environment, parsed once at boot. */
export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(8080),
  DATABASE_URL: z.url({ protocol: /^mysql$|^mariadb$/, error: 'must be a mysql:// or mariadb:// URL' }),
  TRUST_PROXY: trustProxy,
  SMTP_HOST: setting,
  SMTP_PORT: port.optional(),
  SMTP_USER: setting,
  SMTP_PASSWORD: z.string().min(1).optional(),
  /** true: TLS from the first byte (port 465); false: plain, upgraded with STARTTLS when offered. */
  SMTP_SECURE: flag.default(false),
  MAIL_FROM: z.string().min(3).optional(),
  S3_ENDPOINT: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  S3_BUCKET: z.string().regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'must be a bucket name: 3 to 63 lower-case letters, digits, dots and hyphens').optional(),
  S3_ACCESS_KEY_ID: setting,
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_FORCE_PATH_STYLE: flag.default(false),
  DATA_DIR: z.string().min(1).default('.data'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  BODY_LIMIT: z.string().regex(/^\d+(?:b|kb|mb)$/i, 'must look like 512kb or 2mb').default('1mb'),
  JWT_SECRET: z.string({ error: 'is required: at least 32 random bytes, base64url-encoded' })
    .regex(/^[\w-]+$/, 'must be base64url-encoded')
    .refine(value => Buffer.from(value, 'base64url').length >= 32, 'must hold at least 32 random bytes (43 base64url characters or more)'),
  PUBLIC_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
}).superRefine((env, ctx) => {
  const issue = (path: string, message: string): void => void ctx.addIssue({ code: 'custom', path: [path], message })
  if (env.NODE_ENV === 'production') {
    // The local mail catcher is for development: in production mail must reach people.
    if (!env.SMTP_HOST)
      issue('SMTP_HOST', 'is required in production: the SMTP server that sends invitations and password resets (with SMTP_PORT, SMTP_USER, SMTP_PASSWORD, SMTP_SECURE)')
    if (!env.MAIL_FROM)
      issue('MAIL_FROM', 'is required in production: the sender people see, e.g. "Lixivia <lixivia@your-domain>"')
  }
  if (env.SMTP_USER && !env.SMTP_PASSWORD)
    issue('SMTP_PASSWORD', 'is required with SMTP_USER')
  if (env.SMTP_PASSWORD && !env.SMTP_USER)
    issue('SMTP_USER', 'is required with SMTP_PASSWORD')
  const s3Given = [env.S3_ENDPOINT, env.S3_BUCKET, env.S3_ACCESS_KEY_ID, env.S3_SECRET_ACCESS_KEY].some(Boolean)
  if (s3Given) {
    for (const [name, value] of [['S3_BUCKET', env.S3_BUCKET], ['S3_ACCESS_KEY_ID', env.S3_ACCESS_KEY_ID], ['S3_SECRET_ACCESS_KEY', env.S3_SECRET_ACCESS_KEY]] as const) {
      if (!value)
        issue(name, 'is required once any S3_ variable is set (photos then live in that bucket)')
    }
  }
})

type ParsedEnv = z.infer<typeof EnvSchema>

/** Where mail goes: the local catcher in development, a real server otherwise. */
export interface MailSettings { host: string, port: number, secure: boolean, user?: string, password?: string, from: string }
/** An S3-compatible bucket for uploaded files. */
export interface S3Settings { endpoint?: string, bucket: string, region: string, accessKeyId: string, secretAccessKey: string, forcePathStyle: boolean }

export type Env = Omit<ParsedEnv, 'SMTP_HOST' | 'SMTP_PORT' | 'MAIL_FROM'> & {
  SMTP_HOST: string
  SMTP_PORT: number
  MAIL_FROM: string
  PUBLIC_URL: string
  /** Whether the refresh cookie is always Secure (production sits behind HTTPS). */
  SECURE_COOKIES: boolean
}

/** Thrown when the environment is unusable; its message names every bad variable. */
export class ConfigError extends Error {
  override name = 'ConfigError'
}

/**
 * Parses an environment (process.env by default). `mariadb://` is accepted as a synonym of
 * `mysql://` and normalised, since mysql2 only knows the latter. In development mail goes to the
 * local catcher on 127.0.0.1:2526 unless SMTP_HOST names another server.
 */
export function parseEnv(source: Record<string, string | undefined> = process.env): Env {
  const result = EnvSchema.safeParse(source)
  if (!result.success) {
    const lines = result.error.issues.map(issue => `  ${issue.path.join('.') || '(root)'}: ${issue.message}`)
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`)
  }
  const env = result.data
  const host = env.HOST.includes(':') ? `[${env.HOST}]` : env.HOST
  return {
    ...env,
    DATABASE_URL: env.DATABASE_URL.replace(/^mariadb:/, 'mysql:'),
    SMTP_HOST: env.SMTP_HOST ?? '127.0.0.1',
    SMTP_PORT: env.SMTP_PORT ?? (env.SMTP_HOST ? (env.SMTP_SECURE ? 465 : 587) : 2526),
    MAIL_FROM: env.MAIL_FROM ?? 'Lixivia <no-reply@lixivia.test>',
    PUBLIC_URL: env.PUBLIC_URL ?? `http://${host}:${env.PORT}/`,
    SECURE_COOKIES: env.NODE_ENV === 'production',
  }
}

export function mailSettingsOf(env: Env): MailSettings {
  return { host: env.SMTP_HOST, port: env.SMTP_PORT, secure: env.SMTP_SECURE, user: env.SMTP_USER, password: env.SMTP_PASSWORD, from: env.MAIL_FROM }
}

/** The bucket the S3_ variables name, or undefined when photos stay on disk. */
export function s3SettingsOf(env: Env): S3Settings | undefined {
  if (!env.S3_BUCKET || !env.S3_ACCESS_KEY_ID || !env.S3_SECRET_ACCESS_KEY)
    return undefined
  return { endpoint: env.S3_ENDPOINT, bucket: env.S3_BUCKET, region: env.S3_REGION, accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY, forcePathStyle: env.S3_FORCE_PATH_STYLE }
}

/**
 * The development mail listing (`/api/v1/dev/mail`) shows reset and invitation links, so it is
 * served only where nobody but the person at this machine can reach it: outside production, and
 * while the app listens on loopback.
 */
export function servesDevMail(env: Pick<Env, 'NODE_ENV' | 'HOST'>): boolean {
  return env.NODE_ENV !== 'production' && isLoopback(env.HOST)
}
