import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import { AuditEvent } from '../models'

export interface AuditEntry {
  actorUserId: number | null
  action: string
  subjectType?: string
  subjectId?: string | number
  detail?: Record<string, unknown>
}

/** Appends to the audit trail: who did what to which record, when and from which address. */
export async function recordAudit(event: H3Event | null, entry: AuditEntry, transaction?: Transaction) {
  useDb()
  await AuditEvent.create({
    actorUserId: entry.actorUserId,
    action: entry.action,
    subjectType: entry.subjectType ?? null,
    subjectId: entry.subjectId === undefined ? null : String(entry.subjectId),
    detail: entry.detail ? JSON.stringify(entry.detail) : null,
    ip: event ? clientAddress(event) : null,
  }, { transaction })
}

/** The caller's address as the server sees it (the proxy's own address unless NUXT_TRUST_PROXY is set). */
export function clientAddress(event: H3Event): string {
  // Environment overrides arrive as strings, the default as a boolean.
  const trustProxy = String(useRuntimeConfig().trustProxy) === 'true'
  return (getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown').slice(0, 45)
}
