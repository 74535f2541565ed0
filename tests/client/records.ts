import type { EntityData, EntityName } from '../../shared/schemas/entities'
import type { EntityDerived } from '../../shared/schemas/records'
import type { LocalRecord } from '../../src/db/database'

/**
 * A record as the phone stores it, for component and composable tests: the envelope filled in,
 * clean, at rev 1, with the fields a test gives (it names only what it checks).
 */
export function localRecord<E extends EntityName>(_entity: E, fields: Partial<EntityData<E>> & { id?: string, derived?: EntityDerived<E> | null, rev?: number | null, sync?: LocalRecord<E>['sync'], createdBy?: string }): LocalRecord<E> {
  const at = '2026-12-01T08:00:00.000Z'
  return { id: 'r', teamId: 't', createdBy: 'u', createdAt: at, updatedAt: at, rev: 1, deletedAt: null, derived: null, history: [], historyCount: 0, sync: { state: 'clean', baseRev: 1 }, ...fields } as LocalRecord<E>
}
