import type { Ref } from 'vue'
import type { LocalRecord } from '../db/database'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

export interface CuppingTableView {
  table: LocalRecord<'cuppingTable'> | undefined
  /** The lots in the order the table lists them; a lot not on this phone is left out. */
  lots: LocalRecord<'lot'>[]
  /** The table's bowls by lot, in the order they were brewed. */
  bowls: Map<string, LocalRecord<'brew'>[]>
  scores: LocalRecord<'score'>[]
  /** Photos of the table's bowls. */
  photos: LocalRecord<'photo'>[]
}

const none: CuppingTableView = { table: undefined, lots: [], bowls: new Map(), scores: [], photos: [] }

/** A cupping table with its lots, bowls, scores and bowl photos, as they change on the phone. */
export function useCuppingTable(tableId: Ref<string>) {
  return useLiveQuery(async (): Promise<CuppingTableView> => {
    const table = await db.cuppingTables.get(tableId.value)
    if (!table)
      return none
    const [lots, brews, scores] = await Promise.all([
      db.lots.bulkGet(table.lotIds),
      // The bowls of the table's lots, found by the lot they were brewed for (an index), not by the team.
      db.brews.where('context.refId').anyOf(table.lotIds).filter(brew => !brew.deletedAt && brew.teamId === table.teamId && brew.context.kind === 'lot' && brew.context.tableId === table.id).toArray(),
      db.scores.where('tableId').equals(table.id).filter(score => !score.deletedAt).toArray(),
    ])
    const bowls = new Map<string, LocalRecord<'brew'>[]>(table.lotIds.map(id => [id, []]))
    for (const brew of brews.sort((a, b) => a.brewedAt.localeCompare(b.brewedAt)))
      bowls.get(brew.context.refId ?? '')?.push(brew)
    const photos = brews.length ? (await db.photos.where('brewId').anyOf(brews.map(b => b.id)).toArray()).filter(p => !p.deletedAt) : []
    return { table, lots: lots.filter((lot): lot is LocalRecord<'lot'> => Boolean(lot && !lot.deletedAt)), bowls, scores, photos }
  }, none, tableId)
}
