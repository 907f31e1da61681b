import type { OutboxMessage } from '../models'
import type { OutboxStatus } from '../models/outbox-message'

/** Columns an outbox listing reads: everything but the bodies and headers, which can be large. */
export const outboxListAttributes = { exclude: ['textBody', 'htmlBody', 'headers'] }

/** One outbox row as the desk's mail log and the admin outbox show it: delivery state, attempts, last error. */
export function outboxView(m: OutboxMessage) {
  return {
    id: Number(m.id),
    kind: m.kind,
    toAddress: m.toAddress,
    subject: m.subject,
    messageId: m.messageId,
    status: m.status as OutboxStatus,
    attempts: m.attempts,
    nextAttemptAt: m.nextAttemptAt,
    lastError: m.lastError,
    sentAt: m.sentAt,
    createdAt: m.createdAt,
  }
}
