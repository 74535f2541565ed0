import type { ErrorRequestHandler, RequestHandler } from 'express'
import type { ApiErrorBody } from '../../shared/schemas/api-error'
import { ZodError } from 'zod'
import { HttpError } from '../http-error'

/** Errors that body-parser raises carry a `type` and an HTTP status. */
interface ParserError { type?: string, status?: number, expose?: boolean, message?: string }

function describeZod(error: ZodError): ApiErrorBody['error'] {
  const issues = error.issues.map(issue => ({ path: issue.path.map(String).join('.'), message: issue.message }))
  const first = issues[0]
  const message = first ? `${first.path || 'body'}: ${first.message}` : 'The request is not valid.'
  return { code: 'invalid_input', message, issues }
}

/** Unknown `/api` routes answer in the JSON error shape, never with the app's HTML. */
export const apiNotFound: RequestHandler = (req, res) => {
  const body: ApiErrorBody = { error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl.split('?')[0]}.` } }
  res.status(404).json(body)
}

/** The one place where errors become responses: `{ error: { code, message, issues? } }`. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  let status = 500
  let body: ApiErrorBody['error'] = { code: 'internal', message: 'Something went wrong on the server. The request was not applied.' }

  if (err instanceof ZodError) {
    status = 400
    body = describeZod(err)
  }
  else if (err instanceof HttpError) {
    status = err.status
    body = { code: err.code, message: err.message }
  }
  else if (typeof err === 'object' && err !== null && 'type' in err) {
    const parserError = err as ParserError
    if (parserError.type === 'entity.parse.failed') {
      status = 400
      body = { code: 'malformed_json', message: 'The request body is not valid JSON.' }
    }
    else if (parserError.type === 'entity.too.large') {
      status = 413
      body = { code: 'payload_too_large', message: 'The request body is larger than the server accepts.' }
    }
    else if (parserError.expose && parserError.status && parserError.status < 500) {
      status = parserError.status
      body = { code: 'bad_request', message: parserError.message ?? 'The request could not be read.' }
    }
  }

  if (status >= 500)
    req.log?.error({ err }, 'request failed')
  if (res.headersSent)
    return
  res.status(status).json({ error: body } satisfies ApiErrorBody)
}
