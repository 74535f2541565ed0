import type { FileStorage } from '../storage/files'
import type { Db } from './client'
import { readFile } from 'node:fs/promises'
import { sql } from 'drizzle-orm'
import { v7 as uuidv7 } from 'uuid'
import { hashPassword } from '../services/passwords'
import { createSyncService } from '../services/sync.service'
import { createTeamsService } from '../services/teams.service'
import { fileKey } from '../storage/files'
import { demoRecords } from './demo-records'
import { memberships, teams, teamSyncState, users } from './schema'

/**
 * The demo scenario. Everything here is invented: the town of Kestrel Quay, its harbour-side
 * tasting crew and the people in it. Addresses use the reserved `.test` domain (RFC 2606).
 */
export const demoTeamName = 'Kestrel Quay Tasting Crew'
export const demoPassword = 'kestrel-demo-2026'
export const demoAccounts = [
  { name: 'Ines Marwood', email: 'ines@kestrel-quay.test', role: 'owner' },
  { name: 'Tobiah Lenk', email: 'tobiah@kestrel-quay.test', role: 'lead' },
  { name: 'Mats Quillon', email: 'mats@kestrel-quay.test', role: 'member' },
  { name: 'Dora Vellacott', email: 'dora@kestrel-quay.test', role: 'viewer' },
] as const

/**
 * Seeds the demo team only into an empty database; returns whether it wrote anything. Its records
 * go through the same push as a phone's, so the server derives their results as it always does;
 * the demo photos' pictures (committed under demo-photos/) go into the file store when one is given.
 */
export async function seedDemo(db: Db, files?: FileStorage): Promise<boolean> {
  const [row] = await db.select({ count: sql<number>`count(*)` }).from(users)
  if (Number(row?.count ?? 0) > 0)
    return false
  const passwordHash = await hashPassword(demoPassword)
  const teamId = uuidv7()
  const ids = Object.fromEntries(demoAccounts.map(account => [account.role, uuidv7()])) as Record<(typeof demoAccounts)[number]['role'], string>
  await db.transaction(async (tx) => {
    await tx.insert(teams).values({ id: teamId, name: demoTeamName })
    await tx.insert(teamSyncState).values({ teamId, lastRev: 0 })
    for (const account of demoAccounts) {
      await tx.insert(users).values({ id: ids[account.role], email: account.email, name: account.name, passwordHash })
      await tx.insert(memberships).values({ teamId, userId: ids[account.role], role: account.role })
    }
  })
  const sync = createSyncService({ db, teams: createTeamsService(db) })
  // An edit of a record pushed earlier goes with its rev, as a phone's would.
  const revs = new Map<string, number>()
  for (const { userId, mutations, photos = [] } of demoRecords(teamId, ids)) {
    const { results } = await sync.push(userId, { clientId: uuidv7(), mutations: mutations.map(m => ({ ...m, baseRev: revs.get(m.id) ?? m.baseRev })) })
    const refused = results.find(result => result.status !== 'applied')
    if (refused)
      throw new Error(`The demo data was refused: ${refused.reason ?? refused.status}`)
    results.forEach((result, index) => revs.set(mutations[index]!.id, result.rev!))
    for (const photo of files ? photos : [])
      await files!.put(fileKey(teamId, photo.id), await readFile(new URL(`./demo-photos/${photo.file}`, import.meta.url)), 'image/jpeg')
  }
  return true
}
