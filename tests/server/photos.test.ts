import type { Express } from 'express'
import type { FileStorage } from '../../server/storage/files'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { mkdtempSync, readdirSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships } from '../../server/db/schema'
import { createDiskStorage } from '../../server/storage/disk'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { jpegBytes, pngBytes, webpBytes } from './image-bytes'

let database: TestDatabase
let app: Express
let root: string
let files: FileStorage
let teamId: string
let otherTeamId: string
const crew = {} as Record<Role | 'outsider', Account>

beforeAll(async () => {
  database = await createTestDatabase()
  root = mkdtempSync(path.join(os.tmpdir(), 'lixivia-photos-'))
  files = createDiskStorage(root)
  app = buildTestApp(database, { files })
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Harbour Green Buyers' })).body.team.id
  for (const role of ['lead', 'member', 'viewer'] as const) {
    crew[role] = await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
  crew.outsider = await register(app, 'Outsider')
  otherTeamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.outsider)).send({ name: 'Other Crew' })).body.team.id
})
afterAll(async () => {
  await database.drop()
})

const photoPath = (team: string, id: string) => `/api/v1/teams/${team}/photos/${id}`
function upload(account: Account, bytes: Buffer, options: { team?: string, id?: string, field?: string, name?: string, type?: string } = {}) {
  const id = options.id ?? uuidv7()
  return request(app).put(photoPath(options.team ?? teamId, id)).set(...bearer(account)).attach(options.field ?? 'photo', bytes, { filename: options.name ?? 'green.jpg', contentType: options.type ?? 'image/jpeg' })
}
const storedFiles = (): string[] => readdirSync(path.join(root, teamId)).filter(name => !name.endsWith('.json'))

describe('PUT /api/v1/teams/:teamId/photos/:photoId', () => {
  it('stores a photo the first time (201) and answers a repeat of the same id with 200, storing nothing twice', async () => {
    const id = uuidv7()
    const first = await upload(crew.member, jpegBytes(), { id })
    expect(first.status).toBe(201)
    expect(first.body.photo).toEqual({ id, contentType: 'image/jpeg', sizeBytes: jpegBytes().length, created: true })
    const again = await upload(crew.member, jpegBytes(), { id })
    expect(again.status).toBe(200)
    expect(again.body.photo.created).toBe(false)
    // A different picture under the same id keeps the first one: files are written once.
    const other = await upload(crew.lead, pngBytes(), { id })
    expect(other.status).toBe(200)
    expect(other.body.photo).toMatchObject({ contentType: 'image/jpeg', sizeBytes: jpegBytes().length })
    expect(storedFiles().filter(name => name === id)).toHaveLength(1)
    expect(storedFiles().filter(name => name.endsWith('.part'))).toEqual([])
  })

  it.each([
    ['PNG', pngBytes(), 'image/png'],
    ['WebP', webpBytes(), 'image/webp'],
  ])('takes a %s photo, typed by its bytes whatever its name says', async (_kind, bytes, type) => {
    const response = await upload(crew.member, bytes, { name: 'offer-sheet.jpg', type: 'image/jpeg' })
    expect(response.status).toBe(201)
    expect(response.body.photo.contentType).toBe(type)
  })

  it.each([
    ['a text file named .jpg', Buffer.from('moisture 10.8 %, density 720 g/L\n'.repeat(20))],
    ['a PDF contract', Buffer.concat([Buffer.from('%PDF-1.7\n%\xE2\xE3\xCF\xD3\n'), Buffer.alloc(200, 0x20)])],
    ['a GIF', Buffer.concat([Buffer.from('GIF89a'), Buffer.alloc(200, 0)])],
  ])('refuses %s with 415, whatever type the phone claims', async (_what, bytes) => {
    const id = uuidv7()
    const response = await upload(crew.member, bytes, { id, type: 'image/jpeg', name: 'lot.jpg' })
    expect(response.status).toBe(415)
    expect(response.body.error.message).toMatch(/^photo: .*JPEG, PNG or WebP/)
    expect(storedFiles()).not.toContain(id)
  })

  it('takes a photo of exactly 8 MiB and refuses one byte more with 413', async () => {
    const limit = 8 * 1024 * 1024
    const padded = (size: number) => Buffer.concat([jpegBytes(), Buffer.alloc(size - jpegBytes().length, 0)])
    expect((await upload(crew.member, padded(limit))).status).toBe(201)
    const id = uuidv7()
    const over = await upload(crew.member, padded(limit + 1), { id })
    expect(over.status).toBe(413)
    expect(over.body.error.message).toMatch(/^photo: .*8 MB/)
    expect(storedFiles()).not.toContain(id)
  })

  it('lets viewers add nothing (403) and answers 404 outside the team', async () => {
    expect((await upload(crew.viewer, jpegBytes())).status).toBe(403)
    expect((await upload(crew.outsider, jpegBytes())).status).toBe(404)
    expect((await upload(crew.member, jpegBytes(), { team: otherTeamId })).status).toBe(404)
    expect((await request(app).put(photoPath(teamId, uuidv7())).attach('photo', jpegBytes(), 'x.jpg')).status).toBe(401)
  })

  it('names the field when the photo is missing, sent under another name, or the id is no UUID', async () => {
    const none = await request(app).put(photoPath(teamId, uuidv7())).set(...bearer(crew.member)).field('caption', 'no file')
    expect(none.status).toBe(400)
    expect(none.body.error.message).toMatch(/^photo: attach/)
    const elsewhere = await upload(crew.member, jpegBytes(), { field: 'picture' })
    expect(elsewhere.status).toBe(400)
    expect(elsewhere.body.error.message).toMatch(/^photo: /)
    const badId = await request(app).put(photoPath(teamId, 'lot-4.jpg')).set(...bearer(crew.member)).attach('photo', jpegBytes(), 'x.jpg')
    expect(badId.status).toBe(400)
    expect(badId.body.error.message).toMatch(/^photoId: /)
  })
})

describe('GET /api/v1/teams/:teamId/photos/:photoId', () => {
  it('gives team members, viewers included, the bytes with their content type', async () => {
    const id = uuidv7()
    await upload(crew.member, pngBytes(), { id })
    for (const role of ['owner', 'lead', 'member', 'viewer'] as const) {
      const response = await request(app).get(photoPath(teamId, id)).set(...bearer(crew[role])).buffer(true).parse((res, done) => {
        const chunks: Buffer[] = []
        res.on('data', (chunk: Buffer) => chunks.push(chunk))
        res.on('end', () => done(null, Buffer.concat(chunks)))
      })
      expect(response.status).toBe(200)
      expect(response.headers['content-type']).toBe('image/png')
      expect(Buffer.compare(response.body as Buffer, pngBytes())).toBe(0)
    }
  })

  it('answers 404 outside the team, for a photo it does not have, and 401 signed out', async () => {
    const id = uuidv7()
    await upload(crew.member, jpegBytes(), { id })
    expect((await request(app).get(photoPath(teamId, id)).set(...bearer(crew.outsider))).status).toBe(404)
    expect((await request(app).get(photoPath(otherTeamId, id)).set(...bearer(crew.outsider))).status).toBe(404)
    expect((await request(app).get(photoPath(teamId, uuidv7())).set(...bearer(crew.member))).status).toBe(404)
    expect((await request(app).get(photoPath(teamId, id))).status).toBe(401)
  })
})
