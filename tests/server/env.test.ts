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
  ])('fails fast naming the bad variable (%o)', (source, variable) => {
    expect(() => parseEnv(source)).toThrow(ConfigError)
    expect(() => parseEnv(source)).toThrow(new RegExp(`\\b${variable}:`))
  })
})
