/** An error a service throws on purpose; the error handler turns it into the JSON error shape. */
export class HttpError extends Error {
  override name = 'HttpError'

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
  ) {
    super(message)
  }
}

export const notFoundError = (what = 'resource'): HttpError => new HttpError(404, 'not_found', `No such ${what}.`)
