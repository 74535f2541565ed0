import type { Readable } from 'node:stream'

/** A stored file's bytes as a stream, with what they are. */
export interface StoredFile {
  stream: Readable
  size: number
  contentType: string
}

/**
 * Where uploaded files (photos, imported sheets) live, by key (`teamId/fileId`). Files are written
 * once: a key that already holds a file keeps it, so a repeated upload stores nothing twice.
 * Disk is the default (server/storage/disk.ts); a bucket can stand behind the same interface.
 */
export interface FileStorage {
  /** Stores the bytes unless the key holds a file already; says which happened. */
  put: (key: string, bytes: Buffer, contentType: string) => Promise<{ created: boolean, size: number }>
  /** The file under a key, or null. */
  get: (key: string) => Promise<StoredFile | null>
  /** Removes the file under a key, if any. */
  remove: (key: string) => Promise<void>
}

/** Keys are `teamId/fileId` of lower-case UUIDs: nothing else can name a file, or leave its folder. */
export const fileKeyPattern = /^[0-9a-f]{8}(?:-[0-9a-f]{4}){3}-[0-9a-f]{12}\/[0-9a-f]{8}(?:-[0-9a-f]{4}){3}-[0-9a-f]{12}$/

export function fileKey(teamId: string, fileId: string): string {
  const key = `${teamId.toLowerCase()}/${fileId.toLowerCase()}`
  if (!fileKeyPattern.test(key))
    throw new Error(`Not a file key: ${key}`)
  return key
}
