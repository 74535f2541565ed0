import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { text } from 'node:stream/consumers'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, describe, expect, it } from 'vitest'
import { createDiskStorage } from '../../server/storage/disk'
import { fileKey } from '../../server/storage/files'

const root = mkdtempSync(path.join(os.tmpdir(), 'lixivia-files-'))
const storage = createDiskStorage(root)
const teamId = uuidv7()
afterAll(() => rmSync(root, { recursive: true, force: true }))

describe('createDiskStorage', () => {
  it('stores a file once and reads it back with its type', async () => {
    const key = fileKey(teamId, uuidv7())
    expect(await storage.put(key, Buffer.from('first'), 'image/jpeg')).toEqual({ created: true, size: 5 })
    expect(await storage.put(key, Buffer.from('second try'), 'image/png')).toEqual({ created: false, size: 5 })
    const file = await storage.get(key)
    expect(file).toMatchObject({ size: 5, contentType: 'image/jpeg' })
    expect(await text(file!.stream)).toBe('first')
  })

  it('keeps one file when the same id arrives twice at once', async () => {
    const key = fileKey(teamId, uuidv7())
    const results = await Promise.all(Array.from({ length: 8 }, (_, i) => storage.put(key, Buffer.from(`copy ${i}`), 'image/webp')))
    expect(results.filter(result => result.created)).toHaveLength(1)
    expect(readdirSync(path.join(root, teamId)).filter(name => name.endsWith('.part'))).toEqual([])
  })

  it('answers null for a file it does not have, and forgets a removed one', async () => {
    const key = fileKey(teamId, uuidv7())
    expect(await storage.get(key)).toBeNull()
    await storage.put(key, Buffer.from('gone soon'), 'image/jpeg')
    await storage.remove(key)
    expect(await storage.get(key)).toBeNull()
  })

  it('refuses a key that could leave its folder', async () => {
    await expect(storage.put('../../etc/passwd', Buffer.from('x'), 'text/plain')).rejects.toThrow(/Not a file key/)
    expect(() => fileKey(teamId, '../x')).toThrow(/Not a file key/)
  })
})
