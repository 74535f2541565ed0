import type { EntityData } from '../../shared/schemas/entities'
import type { EntityDerived, HistoryEntry } from '../../shared/schemas/records'
import type { RecordBatch } from './store'
import { and, eq, inArray, isNull } from 'drizzle-orm'
import { computeBrew, fitCalibration } from '../../shared/brewing'
import { brewInputOf } from '../../shared/records/brew-input'
import { records } from '../db/schema'

// The server's own figures, from the same shared/brewing code the phone shows live: what a phone
// sends as derived is never taken. Stored data passed its entity's schema, so it has that shape.

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a ?? null) === JSON.stringify(b ?? null)

/** The line and its statistics, recomputed from the standards. Throws BrewingInputError for unusable points. */
export function deriveCalibration(data: EntityData<'calibration'>): EntityDerived<'calibration'> {
  return { fit: fitCalibration(data.points) }
}

/** Strength and extraction of a stored brew from its readings (but the set-aside ones) and calibration. */
export function deriveBrew(brew: EntityData<'brew'>, readings: { id: string, value: number }[], calibration: EntityData<'calibration'> | null): EntityDerived<'brew'> {
  const result = computeBrew(brewInputOf(brew, readings, calibration))
  return {
    tdsPercent: result.tdsPercent,
    yieldPercent: result.yieldPercent,
    ...(result.missing.length ? { missing: result.missing } : {}),
    ...(result.problem ? { problem: result.problem } : {}),
  }
}

/** A brew whose result may have moved in this batch: the rev of its own edit (if any), and by whom. */
export interface Touch { rev: number | null, by: string }

function resultOf(derived: unknown) {
  const d = (derived ?? {}) as Partial<EntityDerived<'brew'>>
  return { tdsPercent: d.tdsPercent ?? null, yieldPercent: d.yieldPercent ?? null }
}

/**
 * Recomputes the brews a batch touched from all their readings (one query for those already
 * stored). A changed result of a stored brew is a new rev, and its history says how the result
 * moved and how many readings came.
 */
export async function rederive(batch: RecordBatch, touched: Map<string, Touch>, nextRev: () => number): Promise<void> {
  if (touched.size === 0)
    return
  const brewIds = [...touched.keys()]
  const found = new Map<string, { id: string, value: number, fresh: boolean }[]>(brewIds.map(id => [id, []]))
  const stored = await batch.tx.select({ id: records.id, parentId: records.parentId, data: records.data }).from(records).where(and(inArray(records.parentId, brewIds), eq(records.entity, 'reading'), isNull(records.deletedAt)))
  const seen = new Set<string>()
  for (const reading of stored) {
    seen.add(reading.id)
    // Stored readings passed the reading schema: their value is a number.
    found.get(reading.parentId!)?.push({ id: reading.id, value: Number(reading.data.value), fresh: false })
  }
  for (const row of batch.created('reading')) {
    if (!seen.has(row.id))
      found.get(row.data.brewId)?.push({ id: row.id, value: row.data.value, fresh: true })
  }
  for (const [brewId, touch] of touched) {
    const brew = await batch.find('brew', brewId)
    if (!brew)
      continue
    const calibration = brew.data.calibrationId ? await batch.find('calibration', brew.data.calibrationId) : undefined
    const all = found.get(brewId) ?? []
    const derived = deriveBrew(brew.data, all, calibration?.data ?? null)
    if (same(derived, brew.derived))
      continue
    const rev = touch.rev ?? nextRev()
    let next = { ...brew, derived, rev, updatedAt: new Date() }
    if (!batch.isNew(brewId)) {
      const added = all.filter(r => r.fresh).length
      const changes: HistoryEntry['changes'] = {
        result: { from: resultOf(brew.derived), to: resultOf(derived) },
        ...(added ? { readings: { from: all.length - added, to: all.length } } : {}),
      }
      next = batch.note(next, { rev, at: new Date().toISOString(), by: touch.by, op: 'edit', changes })
    }
    batch.write(next)
  }
}
