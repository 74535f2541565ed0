import type { UploadEntry } from '../db/database'
import type { UploadTransport } from '../sync/uploads'
import { ApiErrorBodySchema } from '../../shared/schemas/api-error'
import { ApiError, currentAccessToken, refreshSession } from './client'

/** One multipart PUT with upload progress (fetch reports none), answered as the API client would. */
function put(entry: UploadEntry, onProgress: (fraction: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const request = new XMLHttpRequest()
    request.open('PUT', `/api/v1${entry.path}`)
    request.setRequestHeader('Accept', 'application/json')
    const token = currentAccessToken()
    if (token)
      request.setRequestHeader('Authorization', `Bearer ${token}`)
    request.upload.onprogress = event => event.lengthComputable && onProgress(event.loaded / event.total)
    request.onerror = () => reject(new ApiError(0, 'network', 'The team server cannot be reached from this phone right now.'))
    request.ontimeout = request.onerror
    request.onload = () => {
      if (request.status >= 200 && request.status < 300)
        return resolve()
      let body: unknown
      try {
        body = JSON.parse(request.responseText)
      }
      catch {}
      const error = ApiErrorBodySchema.safeParse(body)
      reject(error.success ? new ApiError(request.status, error.data.error.code, error.data.error.message) : new ApiError(request.status, 'http_error', `The team server answered with status ${request.status}.`))
    }
    const form = new FormData()
    form.append(entry.field, entry.blob, entry.fileName)
    request.send(form)
  })
}

/** Uploads through the API, refreshing the session once on a 401 as every other call does. */
export const apiUploads: UploadTransport = {
  async put(entry, onProgress) {
    try {
      await put(entry, onProgress)
    }
    catch (error) {
      if (!(error instanceof ApiError && error.status === 401) || !(await refreshSession()))
        throw error
      await put(entry, onProgress)
    }
  },
}
