import type { Express } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships } from '../../server/db/schema'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { now, pourOver, pull, push, put } from './sync-helpers'

let database: TestDatabase
let app: Express
let teamId: string
const crew = {} as Record<Exclude<Role, 'viewer'>, Account>

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Saltmarsh Pop-up Bar' })).body.team.id
  for (const role of ['lead', 'member'] as const) {
    crew[role] = await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
})
afterAll(async () => {
  await database.drop()
})

const filter = { name: 'Market filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: '', beverageMass: 220, retainedRatio: 2, timeToleranceSeconds: null, zoneId: 'european-drip', retired: false }
/** Settings as a phone sends them; some tests send ones the schema refuses. */
type Settings = Record<string, unknown>

/** A version of a recipe and the recipe pointing at it, as the phone queues them (version first). */
function change(recipeId: string, settings: Settings, number: number, basedOnId: string | null, baseRev: number | null = null) {
  const version = put('recipeVersion', teamId, { recipeId, number, basedOnId, reason: number === 1 ? 'First version' : `Change ${number}`, settings })
  return { version, recipe: put('recipe', teamId, { ...settings, versionId: version.id }, { id: recipeId, baseRev }) }
}

const results = (response: request.Response) => response.body.results as { status: string, reason?: string, rev?: number }[]

/** A recipe at version 1, made by the given person; returns its ids and the recipe's rev. */
async function newRecipe(by: Account, settings: Settings = filter) {
  const id = uuidv7()
  const { version, recipe } = change(id, settings, 1, null)
  const answer = results(await push(app, by, [version, recipe]))
  expect(answer.map(r => r.status)).toEqual(['applied', 'applied'])
  return { id, versionId: version.id, rev: answer[1]!.rev! }
}

describe('recipe versions', () => {
  it('take a new recipe with its first version, and phones receive both', async () => {
    const { id, versionId } = await newRecipe(crew.member)
    const changes = (await pull(app, crew.owner, teamId)).body.changes as { entity: string, id: string, data: Record<string, unknown> }[]
    expect(changes.find(c => c.id === id)?.data).toMatchObject({ name: 'Market filter', versionId })
    expect(changes.find(c => c.id === versionId)?.data).toMatchObject({ recipeId: id, number: 1, reason: 'First version', settings: { dose: 15 } })
  })

  it('refuse a recipe that names no version, or fields its version does not hold', async () => {
    expect(results(await push(app, crew.member, [put('recipe', teamId, { ...filter, versionId: null })]))[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^versionId: a recipe changes only through a new version/) })
    const { version, recipe } = change(uuidv7(), filter, 1, null)
    const answer = results(await push(app, crew.member, [version, { ...recipe, data: { ...recipe.data, dose: 16 } }]))
    expect(answer[1]).toMatchObject({ status: 'rejected', reason: 'dose: differs from version 1; a recipe\'s fields are those of its current version.' })
  })

  it('refuse an edit of a recipe that comes without a new version', async () => {
    const { id, rev } = await newRecipe(crew.member)
    const answer = results(await push(app, crew.member, [put('recipe', teamId, { grindSetting: '20 clicks' }, { id, baseRev: rev })]))
    expect(answer[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^grindSetting: differs from version 1/) })
  })

  it('number each change after the one it follows, and keep who made it and why', async () => {
    const { id, versionId, rev } = await newRecipe(crew.member)
    const { version, recipe } = change(id, { ...filter, grindSetting: '20 clicks' }, 2, versionId, rev)
    expect(results(await push(app, crew.member, [version, recipe])).map(r => r.status)).toEqual(['applied', 'applied'])
    const changes = (await pull(app, crew.owner, teamId)).body.changes as { id: string, data: Record<string, unknown> }[]
    expect(changes.find(c => c.id === version.id)?.data).toMatchObject({ number: 2, basedOnId: versionId, reason: 'Change 2', createdBy: crew.member.id })
    expect(changes.find(c => c.id === id)?.data).toMatchObject({ grindSetting: '20 clicks', versionId: version.id })
  })

  it('refuse a version started from an older one, after a teammate\'s change landed (two phones offline)', async () => {
    const { id, versionId, rev } = await newRecipe(crew.lead)
    const first = change(id, { ...filter, dose: 16 }, 2, versionId, rev)
    await push(app, crew.lead, [first.version, first.recipe])
    const late = change(id, { ...filter, dose: 14 }, 2, versionId, rev)
    const answer = results(await push(app, crew.owner, [late.version, late.recipe], uuidv7()))
    expect(answer[0]).toMatchObject({ status: 'rejected', reason: 'basedOnId: version 2 of “Market filter” was recorded since this change was started; open the recipe again and make the change on it.' })
    // The recipe's own edit clashes with the change that landed: the phone shows both copies.
    expect(answer[1]!.status).toBe('conflict')
  })

  it('refuse a wrong number, a method change and a version of another recipe', async () => {
    const { id, versionId } = await newRecipe(crew.member)
    const other = await newRecipe(crew.member)
    const wrongNumber = put('recipeVersion', teamId, { recipeId: id, number: 5, basedOnId: versionId, reason: 'Skip ahead', settings: filter })
    const espresso = put('recipeVersion', teamId, { recipeId: id, number: 2, basedOnId: versionId, reason: 'Make it espresso', settings: { ...filter, method: 'espresso', waterMass: null, beverageMass: 36 } })
    const crossed = put('recipeVersion', teamId, { recipeId: id, number: 2, basedOnId: other.versionId, reason: 'Crossed', settings: filter })
    const answer = results(await push(app, crew.member, [wrongNumber, espresso, crossed]))
    expect(answer.map(r => r.reason)).toEqual([
      'number: the version after version 1 is version 2.',
      'method: “Market filter” stays a percolation recipe; copy it to make one for another method.',
      'basedOnId: names no version of this recipe on the server.',
    ])
  })

  it('are never changed or deleted once recorded', async () => {
    const { versionId } = await newRecipe(crew.member)
    const [edited] = results(await push(app, crew.member, [put('recipeVersion', teamId, { reason: 'Rewritten' }, { id: versionId, baseRev: 1 })]))
    expect(edited).toMatchObject({ status: 'rejected', reason: 'Recipe versions cannot be changed once recorded; add a new one instead.' })
    const [removed] = results(await push(app, crew.member, [{ mutationId: uuidv7(), entity: 'recipeVersion', op: 'delete', id: versionId, teamId, baseRev: 1 }]))
    expect(removed).toMatchObject({ status: 'rejected', reason: 'Recipe versions are kept as recorded and cannot be deleted.' })
  })

  it('need the reason for a change, and refuse a member adding one to a teammate\'s recipe', async () => {
    const { id, versionId } = await newRecipe(crew.lead)
    const blank = put('recipeVersion', teamId, { recipeId: id, number: 2, basedOnId: versionId, reason: ' ', settings: filter })
    expect(results(await push(app, crew.lead, [blank]))[0]).toMatchObject({ status: 'rejected', reason: 'reason: must not be empty' })
    const theirs = change(id, { ...filter, grindSetting: '21 clicks' }, 2, versionId)
    expect(results(await push(app, crew.member, [theirs.version]))[0]).toMatchObject({ status: 'rejected', reason: 'Members can add recipe versions only to their own recipes; ask a lead to correct this one.' })
  })

  it('let an espresso recipe carry no water, and refuse one without its beverage', async () => {
    const shot = { ...filter, name: 'Market espresso', method: 'espresso', dose: 18, waterMass: null, beverageMass: 36, contactTimeSeconds: 28, timeToleranceSeconds: 3, zoneId: 'espresso' }
    await newRecipe(crew.member, shot)
    const { version } = change(uuidv7(), { ...shot, beverageMass: null }, 1, null)
    expect(results(await push(app, crew.member, [version]))[0]).toMatchObject({ status: 'rejected', reason: 'settings.beverageMass: must be given for an espresso (the target beverage mass)' })
  })
})

describe('house recipes', () => {
  it('are marked by a lead or an owner only, and never changed afterwards', async () => {
    const { id } = await newRecipe(crew.member)
    const mark = put('houseRecipe', teamId, { method: 'percolation', recipeId: id })
    expect(results(await push(app, crew.member, [mark]))[0]).toMatchObject({ status: 'rejected', reason: 'Only a lead or an owner can set up or change house recipes.' })
    const [applied] = results(await push(app, crew.lead, [mark]))
    expect(applied!.status).toBe('applied')
    expect(results(await push(app, crew.owner, [put('houseRecipe', teamId, { recipeId: null }, { id: mark.id, baseRev: applied!.rev })]))[0]).toMatchObject({ status: 'rejected', reason: 'House recipes cannot be changed once recorded; add a new one instead.' })
  })

  it('reach every phone in the order they were made, so the latest stands everywhere', async () => {
    const first = await newRecipe(crew.member)
    const second = await newRecipe(crew.member)
    const marks = [put('houseRecipe', teamId, { method: 'percolation', recipeId: first.id }), put('houseRecipe', teamId, { method: 'percolation', recipeId: second.id })]
    await push(app, crew.lead, marks)
    const pulled = ((await pull(app, crew.member, teamId)).body.changes as { id: string, rev: number }[]).filter(c => marks.some(m => m.id === c.id))
    expect(pulled.map(c => c.id)).toEqual(marks.map(m => m.id))
    expect(pulled[1]!.rev).toBeGreaterThan(pulled[0]!.rev)
  })

  it('refuse a recipe of another method, a retired one and one not on the server', async () => {
    const { id, versionId, rev } = await newRecipe(crew.lead)
    const retire = change(id, { ...filter, retired: true }, 2, versionId, rev)
    await push(app, crew.lead, [retire.version, retire.recipe])
    const other = await newRecipe(crew.lead)
    const answer = results(await push(app, crew.lead, [
      put('houseRecipe', teamId, { method: 'espresso', recipeId: other.id }),
      put('houseRecipe', teamId, { method: 'percolation', recipeId: id }),
      put('houseRecipe', teamId, { method: 'percolation', recipeId: uuidv7() }),
    ]))
    expect(answer.map(r => r.reason)).toEqual([
      'method: “Market filter” is a percolation recipe, not an espresso one.',
      'recipeId: “Market filter” is retired; bring it back first.',
      'The recipe this record belongs to is not on the server.',
    ])
  })
})

describe('brews of a recipe', () => {
  it('point at the version they followed, of that recipe only', async () => {
    const mine = await newRecipe(crew.member)
    const other = await newRecipe(crew.member)
    const session = put('dialIn', teamId, { recipeId: mine.id, method: 'percolation', place: 'Saltmarsh Night Market, stall 14', grinder: 'Flat burr, new', water: 'Venue tap through a jug filter', startedAt: now() })
    const followed = put('brew', teamId, pourOver({ context: { kind: 'recipe', refId: mine.id, versionId: mine.versionId, sessionId: session.id }, changeNote: 'First attempt' }))
    const crossed = put('brew', teamId, pourOver({ context: { kind: 'recipe', refId: mine.id, versionId: other.versionId } }))
    const answer = results(await push(app, crew.member, [session, followed, crossed]))
    expect(answer.map(r => r.status)).toEqual(['applied', 'applied', 'rejected'])
    expect(answer[2]!.reason).toBe('context.versionId: names a version of another recipe.')
  })

  it('start a dial-in only on a recipe of the session\'s method', async () => {
    const { id } = await newRecipe(crew.member)
    const answer = results(await push(app, crew.member, [put('dialIn', teamId, { recipeId: id, method: 'espresso', place: 'Harbour fair', startedAt: now() })]))
    expect(answer[0]!.reason).toBe('method: “Market filter” is a percolation recipe, not an espresso one.')
  })
})
