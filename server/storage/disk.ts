import type { FileStorage } from './files'
import { createReadStream } from 'node:fs'
import { link, mkdir, readFile, rm, stat, unlink, writeFile } from 'node:fs/promises'
import path from 'node:path'
import { v7 as uuidv7 } from 'uuid'
import { fileKeyPattern } from './files'

/**
 * Files on disk under one folder (DATA_DIR/uploads by default): `teamId/fileId` holds the bytes and
 * `teamId/fileId.json` what they are. A file is written to a temporary name and linked into place,
 * which fails if the name exists: two uploads of one id at once store it once, and a reader never
 * sees half a file.
 */
export function createDiskStorage(root: string): FileStorage {
  const where = (key: string): string => {
    if (!fileKeyPattern.test(key))
      throw new Error(`Not a file key: ${key}`)
    return path.join(root, ...key.split('/'))
  }

  return {
    async put(key, bytes, contentType) {
      const target = where(key)
      await mkdir(path.dirname(target), { recursive: true })
      const existing = await stat(target).catch(() => null)
      if (existing)
        return { created: false, size: existing.size }
      // The description first: a file that exists always has one.
      await writeFile(`${target}.json`, JSON.stringify({ contentType, size: bytes.length }))
      const temporary = `${target}.${uuidv7()}.part`
      await writeFile(temporary, bytes)
      try {
        await link(temporary, target)
        return { created: true, size: bytes.length }
      }
      catch (error) {
        if ((error as NodeJS.ErrnoException).code !== 'EEXIST')
          throw error
        return { created: false, size: (await stat(target)).size }
      }
      finally {
        await unlink(temporary).catch(() => {})
      }
    },

    async get(key) {
      const target = where(key)
      const [info, description] = await Promise.all([stat(target).catch(() => null), readFile(`${target}.json`, 'utf8').catch(() => null)])
      if (!info || !description)
        return null
      const { contentType } = JSON.parse(description) as { contentType: string }
      return { stream: createReadStream(target), size: info.size, contentType }
    },

    async remove(key) {
      const target = where(key)
      await rm(target, { force: true })
      await rm(`${target}.json`, { force: true })
    },
  }
}
