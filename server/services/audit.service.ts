import type { Db } from '../db/client'
import { auditLog } from '../db/schema'

export interface AuditEntry {
  action: string
  actorId?: string | null
  teamId?: string | null
  subjectId?: string | null
  detail?: Record<string, unknown>
  ip?: string | null
}

/** Appends one row to the audit log (never updated, never deleted by the app). */
export async function audit(db: Pick<Db, 'insert'>, entry: AuditEntry): Promise<void> {
  await db.insert(auditLog).values({
    action: entry.action,
    actorId: entry.actorId ?? null,
    teamId: entry.teamId ?? null,
    subjectId: entry.subjectId ?? null,
    detail: entry.detail ?? null,
    ip: entry.ip?.slice(0, 45) ?? null,
  })
}
