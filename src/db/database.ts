import type { Table } from 'dexie'
import type { Membership, User } from '../../shared/schemas/auth'
import Dexie from 'dexie'

/** Who was signed in on this phone, so the app opens offline under that identity. No tokens. */
export interface CachedIdentity {
  key: 'current'
  user: User
  memberships: Membership[]
  activeTeamId: string | null
  cachedAt: string
}

/** The one IndexedDB database of the app. Versions are only ever appended, never edited. */
export class LixiviaDatabase extends Dexie {
  identity!: Table<CachedIdentity, 'current'>

  constructor(name = 'lixivia') {
    super(name)
    this.version(1).stores({ identity: 'key' })
  }
}

export const db = new LixiviaDatabase()
