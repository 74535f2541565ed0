import type { Db } from './client'
import { sql } from 'drizzle-orm'
import { v7 as uuidv7 } from 'uuid'
import { hashPassword } from '../services/passwords'
import { memberships, teams, users } from './schema'

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

/** Seeds the demo team only into an empty database; returns whether it wrote anything. */
export async function seedDemo(db: Db): Promise<boolean> {
  const [row] = await db.select({ count: sql<number>`count(*)` }).from(users)
  if (Number(row?.count ?? 0) > 0)
    return false
  const passwordHash = await hashPassword(demoPassword)
  const teamId = uuidv7()
  await db.transaction(async (tx) => {
    await tx.insert(teams).values({ id: teamId, name: demoTeamName })
    for (const account of demoAccounts) {
      const userId = uuidv7()
      await tx.insert(users).values({ id: userId, email: account.email, name: account.name, passwordHash })
      await tx.insert(memberships).values({ teamId, userId, role: account.role })
    }
  })
  return true
}
