import { describe, expect, it } from 'vitest'
import { ConfigError, parseEnv } from '../../server/env'

const valid = { DATABASE_URL: 'mysql://u:p@127.0.0.1:3307/lixivia', JWT_SECRET: 'q'.repeat(43) }

describe('parseEnv', () => {
  it('fills the defaults', () => {
    const env = parseEnv(valid)
    expect(env).toMatchObject({ PORT: 8080, HOST: '127.0.0.1', SMTP_PORT: 2526, NODE_ENV: 'development', PUBLIC_URL: 'http://127.0.0.1:8080/' })
  })

  it('accepts mariadb:// and hands mysql2 a mysql:// URL', () => {
    expect(parseEnv({ ...valid, DATABASE_URL: 'mariadb://u:p@db:3306/x' }).DATABASE_URL).toBe('mysql://u:p@db:3306/x')
  })

  it.each([
    [{ ...valid, PORT: 'eighty' }, 'PORT'],
    [{ ...valid, PORT: '70000' }, 'PORT'],
    [{ ...valid, DATABASE_URL: 'postgres://x@y/z' }, 'DATABASE_URL'],
    [{ JWT_SECRET: valid.JWT_SECRET }, 'DATABASE_URL'],
    [{ DATABASE_URL: valid.DATABASE_URL }, 'JWT_SECRET'],
    [{ ...valid, JWT_SECRET: 'too-short' }, 'JWT_SECRET'],
    [{ ...valid, LOG_LEVEL: 'loud' }, 'LOG_LEVEL'],
    [{ ...valid, BODY_LIMIT: 'lots' }, 'BODY_LIMIT'],
    [{ ...valid, NODE_ENV: 'production', MAIL_FROM: 'Lixivia <crew@kestrel-quay.test>' }, 'SMTP_HOST'],
    [{ ...valid, NODE_ENV: 'production', SMTP_HOST: 'smtp.kestrel-quay.test' }, 'MAIL_FROM'],
    [{ ...valid, SMTP_USER: 'crew' }, 'SMTP_PASSWORD'],
    [{ ...valid, SMTP_PASSWORD: 'secret' }, 'SMTP_USER'],
    [{ ...valid, SMTP_SECURE: 'maybe' }, 'SMTP_SECURE'],
    [{ ...valid, S3_BUCKET: 'lixivia-photos', S3_ACCESS_KEY_ID: 'key' }, 'S3_SECRET_ACCESS_KEY'],
    [{ ...valid, S3_ENDPOINT: 'http://127.0.0.1:9000', S3_ACCESS_KEY_ID: 'key', S3_SECRET_ACCESS_KEY: 'secret' }, 'S3_BUCKET'],
    [{ ...valid, S3_BUCKET: 'Holiday Photos!' }, 'S3_BUCKET'],
    [{ ...valid, TRUST_PROXY: 'caddy' }, 'TRUST_PROXY'],
    [{ ...valid, TRUST_PROXY: '10.0.0.0/40' }, 'TRUST_PROXY'],
  ])('fails fast naming the bad variable (%o)', (source, variable) => {
    expect(() => parseEnv(source)).toThrow(ConfigError)
    expect(() => parseEnv(source)).toThrow(new RegExp(`\\b${variable}:`))
  })

  it('sends mail to the local catcher in development and to the named server otherwise', () => {
    expect(parseEnv(valid)).toMatchObject({ SMTP_HOST: '127.0.0.1', SMTP_PORT: 2526, SMTP_SECURE: false, SECURE_COOKIES: false })
    expect(parseEnv({ ...valid, SMTP_HOST: 'smtp.kestrel-quay.test' }).SMTP_PORT).toBe(587)
    expect(parseEnv({ ...valid, SMTP_HOST: 'smtp.kestrel-quay.test', SMTP_SECURE: 'true' }).SMTP_PORT).toBe(465)
    expect(parseEnv({ ...valid, NODE_ENV: 'production', SMTP_HOST: 'smtp.kestrel-quay.test', MAIL_FROM: 'Lixivia <crew@kestrel-quay.test>' }).SECURE_COOKIES).toBe(true)
  })

  it.each([
    [undefined, false],
    ['false', false],
    ['127.0.0.1', ['127.0.0.1']],
    ['loopback, 10.8.0.0/16, ::1', ['loopback', '10.8.0.0/16', '::1']],
  ])('believes forwarded addresses from TRUST_PROXY=%s only', (value, trusted) => {
    expect(parseEnv({ ...valid, TRUST_PROXY: value }).TRUST_PROXY).toEqual(trusted)
  })
})
