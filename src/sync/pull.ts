import type { EntityName } from '../../shared/schemas/entities'
import type { EntityRecord } from '../../shared/schemas/records'
import type { Change } from '../../shared/schemas/sync'
import type { LixiviaDatabase, LocalRecord } from '../db/database'
import { isEntityName } from '../../shared/records/registry'
import { recordSchemaOf } from '../../shared/schemas/records'
import { localCopy } from '../db/database'

// What the engine does with a pulled page: its changes by entity, each entity's share kept at once.

/** A record as the server sent it, read with this version's schema; undefined when it cannot be read. */
export function readServerRecord<E extends EntityName>(entity: E, data: unknown): EntityRecord<E> | undefined {
  const parsed = recordSchemaOf(entity).safeParse(data)
  return parsed.success ? parsed.data : undefined
}

/** A page's changes by entity; a kind of record a newer server has and this version does not know is passed over. */
export function byEntityOf(changes: Change[]): Map<EntityName, Change[]> {
  const byEntity = new Map<EntityName, Change[]>()
  for (const change of changes) {
    if (!isEntityName(change.entity))
      continue
    const list = byEntity.get(change.entity)
    if (list)
      list.push(change)
    else
      byEntity.set(change.entity, [change])
  }
  return byEntity
}

/**
 * Keeps one entity's share of a pulled page, written in one bulkPut. A record with changes of its
 * own here is settled by its push, never overwritten: those are found on the sync-state index
 * (a handful at most), not by reading the phone's copy of every record in the page. Returns how
 * many records this version could not read (they are skipped, not stored).
 */
export async function keepPulled<E extends EntityName>(database: LixiviaDatabase, entity: E, changes: Change[]): Promise<number> {
  const table = database.records[entity]
  const own = new Set(await table.where('sync.state').anyOf(['pending', 'conflict', 'rejected']).primaryKeys())
  const kept: LocalRecord<E>[] = []
  let skipped = 0
  changes.forEach((change) => {
    if (own.has(change.id))
      return
    const record = readServerRecord(entity, change.data)
    if (record)
      kept.push(localCopy(record, { state: 'clean', baseRev: record.rev }))
    else
      skipped += 1
  })
  await table.bulkPut(kept)
  return skipped
}
