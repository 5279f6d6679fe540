import type { Knex } from 'knex'

export interface AuditEntry {
  orgId: number | null
  actorUserId: number | null
  action: string
  objectType: string
  objectId?: number | null
  detail?: Record<string, unknown>
}

/** Records who did what to which object; pass the transaction so the entry commits with the change. */
export async function recordAudit(db: Knex | Knex.Transaction, entry: AuditEntry): Promise<void> {
  await db('auditEvents').insert({ ...entry, objectId: entry.objectId ?? null, detail: entry.detail ? JSON.stringify(entry.detail) : null })
}
