/**
 * A failed API call: the server's error code and message, or `network` when nothing answered. In a
 * module of its own (no schemas), so forms and the sign-in screen can name it without loading zod.
 */
export class ApiError extends Error {
  override name = 'ApiError'

  constructor(readonly status: number, readonly code: string, message: string, readonly issues: { path: string, message: string }[] = []) {
    super(message)
  }
}
