import type { BrewContext, EntityData, EntityName, RecipeSettings } from '../../shared/schemas/entities'
import type { OutboxEntry } from '../../src/db/database'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { definitionOf } from '../../shared/records/registry'
import { LixiviaDatabase } from '../../src/db/database'
import { saveRecord } from '../../src/sync/outbox'
import { adoptAttempt, markHouseRecipe, saveRecipeVersion } from '../../src/sync/recipes'
import { teamId, userId } from './fake-sync-server'

let database: LixiviaDatabase
let counter = 0
beforeEach(() => {
  database = new LixiviaDatabase(`lixivia-recipes-${counter++}`)
})
afterEach(async () => {
  await database.delete()
})

const filter: RecipeSettings = { name: 'Lantern filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: '', beverageMass: 220, retainedRatio: null, timeToleranceSeconds: null, zoneId: null, retired: false }
const saver = { teamId, userId }
const pour = (context: BrewContext, grind: string) => ({ context, method: 'percolation' as const, strengthSource: 'direct' as const, dose: 15, beverageMass: 229, grindSetting: grind, brewedAt: new Date().toISOString() })

/**
 * The server takes a record only once every record it names is there: each queued mutation may
 * name only records already on the server (not queued) or queued ahead of it.
 */
async function expectNamedRecordsQueuedFirst(): Promise<OutboxEntry[]> {
  const queued = await database.outbox.orderBy('seq').toArray()
  const firstSeq = new Map<string, number>()
  const merged = new Map<string, Record<string, unknown>>()
  for (const entry of queued) {
    firstSeq.set(entry.id, Math.min(firstSeq.get(entry.id) ?? Infinity, entry.seq!))
    const data = { ...merged.get(entry.id), ...entry.data }
    merged.set(entry.id, data)
    // Queued data passed the entity's form; the registry reads it as the entity's data.
    for (const link of definitionOf(entry.entity).links(data as EntityData<EntityName>))
      expect(firstSeq.get(link.id) ?? -1, `${entry.entity} ${entry.seq} names ${link.entity} queued behind it`).toBeLessThan(entry.seq!)
  }
  return queued
}

describe('recipes saved offline', () => {
  it('queue each version ahead of the recipe that names it, and the recipe ahead of its brews', async () => {
    const { recipeId, versionId } = await saveRecipeVersion(database, { ...saver, settings: filter, reason: 'First version' })
    await saveRecord(database, 'brew', { ...saver, data: pour({ kind: 'recipe', refId: recipeId, versionId }, '22 clicks') })
    const second = await saveRecipeVersion(database, { ...saver, recipeId, settings: { ...filter, grindSetting: '20 clicks' }, reason: 'Finer' })
    await saveRecipeVersion(database, { ...saver, recipeId, settings: { ...filter, grindSetting: '20 clicks', retired: true }, reason: 'Season over' })
    const queued = await expectNamedRecordsQueuedFirst()
    expect(queued.map(entry => entry.entity)).toEqual(['recipeVersion', 'recipe', 'brew', 'recipeVersion', 'recipe', 'recipeVersion', 'recipe'])
    const versions = await database.recipeVersions.where('recipeId').equals(recipeId).sortBy('number')
    expect(versions.map(v => [v.number, v.basedOnId])).toEqual([[1, null], [2, versionId], [3, second.versionId]])
    expect(await database.recipes.get(recipeId)).toMatchObject({ grindSetting: '20 clicks', retired: true, versionId: versions[2]!.id })
  })

  it('adopt a blank dial-in\'s attempt as a new recipe behind the attempts, then the house mark', async () => {
    const session = await saveRecord(database, 'dialIn', { ...saver, data: { method: 'percolation', place: 'Brackwater Lantern Fair', startedAt: new Date().toISOString() } })
    const first = await saveRecord(database, 'brew', { ...saver, data: { ...pour({ kind: 'quick', refId: null, sessionId: session }, '24 clicks'), changeNote: '' } })
    const second = await saveRecord(database, 'brew', { ...saver, data: { ...pour({ kind: 'quick', refId: null, sessionId: session }, '22 clicks'), changeNote: 'Two clicks finer' } })
    const brew = (await database.brews.get(second))!
    const { recipeId } = await adoptAttempt(database, { ...saver, session: (await database.dialIns.get(session))!, brew, masses: { dose: 15, beverageMass: 229, retainedRatio: null }, name: 'Lantern filter', reason: 'Attempt 2' })
    await markHouseRecipe(database, saver, 'percolation', recipeId)
    const queued = await expectNamedRecordsQueuedFirst()
    expect(queued.map(entry => entry.entity)).toEqual(['dialIn', 'brew', 'brew', 'recipeVersion', 'recipe', 'dialIn', 'houseRecipe'])
    expect(first).not.toBe(second)
    // Attempt 2's numbers, the water by mass balance: 229 + 2.0 × 15 = 259 g (LRR common practice).
    expect(await database.recipes.get(recipeId)).toMatchObject({ name: 'Lantern filter', grindSetting: '22 clicks', dose: 15, beverageMass: 229, waterMass: 259 })
    expect((await database.recipeVersions.toArray())[0]).toMatchObject({ number: 1, reason: 'Attempt 2', fromBrewId: second })
    expect(await database.dialIns.get(session)).toMatchObject({ recipeId })
  })
})
