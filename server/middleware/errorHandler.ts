import type { ErrorRequestHandler, RequestHandler } from 'express'
import type { ApiErrorBody } from '../../shared/schemas/api-error'
import { ZodError } from 'zod'
import { isDatabaseUnavailable } from '../db/unavailable'
import { HttpError } from '../http-error'

/** Errors that body-parser and the router raise carry an HTTP status, and body-parser's a `type`. */
interface ClientError { type?: unknown, status?: unknown, expose?: unknown, code?: unknown, message?: unknown }

interface Answer { status: number, body: ApiErrorBody['error'] }

/** A paused or restarting database is usually back within this; phones retry after it. */
const retryAfterSeconds = 5

function describeZod(error: ZodError): ApiErrorBody['error'] {
  const issues = error.issues.map(issue => ({ path: issue.path.map(String).join('.'), message: issue.message }))
  const first = issues[0]
  const message = first ? `${first.path || 'body'}: ${first.message}` : 'The request is not valid.'
  return { code: 'invalid_input', message, issues }
}

/** zlib's codes start with Z_, brotli's with ERR__ERROR_ (both raised while inflating a body). */
const isDecompressionFailure = (code: unknown): boolean => typeof code === 'string' && /^(?:Z_|ERR__ERROR_)/.test(code)

/** A 4xx that the request itself caused: a body that cannot be read, an address that cannot be decoded. */
function clientError(err: unknown): Answer | undefined {
  if (typeof err !== 'object' || err === null)
    return undefined
  const error = err as ClientError
  if (error.type === 'entity.parse.failed')
    return { status: 400, body: { code: 'malformed_json', message: 'The request body is not valid JSON.' } }
  if (error.type === 'entity.too.large')
    return { status: 413, body: { code: 'payload_too_large', message: 'The request body is larger than the server accepts.' } }
  if (typeof error.status !== 'number' || error.status < 400 || error.status >= 500)
    return undefined
  if (isDecompressionFailure(error.code))
    return { status: 400, body: { code: 'malformed_body', message: 'The request body says it is compressed (Content-Encoding) but could not be decompressed.' } }
  // The router fails to decode a parameter such as `%E0%A4%A` with a URIError of status 400.
  if (err instanceof URIError)
    return { status: 400, body: { code: 'bad_request', message: 'The address holds a broken percent-encoding.' } }
  if (error.expose === true && typeof error.message === 'string')
    return { status: error.status, body: { code: 'bad_request', message: error.message } }
  return undefined
}

/** Unknown `/api` routes answer in the JSON error shape, never with the app's HTML. */
export const apiNotFound: RequestHandler = (req, res) => {
  const body: ApiErrorBody = { error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl.split('?')[0]}.` } }
  res.status(404).json(body)
}

/** The one place where errors become responses: `{ error: { code, message, issues? } }`. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  let answer: Answer = { status: 500, body: { code: 'internal', message: 'Something went wrong on the server. The request was not applied.' } }
  if (err instanceof ZodError)
    answer = { status: 400, body: describeZod(err) }
  else if (err instanceof HttpError)
    answer = { status: err.status, body: { code: err.code, message: err.message } }
  else if (isDatabaseUnavailable(err))
    answer = { status: 503, body: { code: 'unavailable', message: 'The server cannot reach its database right now. Try again in a few seconds.' } }
  else
    answer = clientError(err) ?? answer

  if (answer.status >= 500)
    req.log?.error({ err }, 'request failed')
  if (res.headersSent)
    return
  if (answer.status === 503)
    res.set('Retry-After', String(retryAfterSeconds))
  res.status(answer.status).json({ error: answer.body } satisfies ApiErrorBody)
}
