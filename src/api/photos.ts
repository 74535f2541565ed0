import { ApiError, currentAccessToken, refreshSession } from './client'

async function get(path: string): Promise<Response> {
  const token = currentAccessToken()
  try {
    return await fetch(`/api/v1${path}`, { headers: token ? { Authorization: `Bearer ${token}` } : {}, credentials: 'same-origin' })
  }
  catch {
    throw new ApiError(0, 'network', 'The team server cannot be reached from this phone right now.')
  }
}

/** A teammate's photo from the team server (an <img> cannot send the session's token). */
export async function fetchPhoto(teamId: string, photoId: string): Promise<Blob> {
  const path = `/teams/${teamId}/photos/${photoId}`
  let response = await get(path)
  if (response.status === 401 && (await refreshSession()))
    response = await get(path)
  if (!response.ok)
    throw new ApiError(response.status, response.status === 404 ? 'not_found' : 'http_error', response.status === 404 ? 'This photo has not reached the team server yet.' : `The team server answered with status ${response.status}.`)
  return response.blob()
}
