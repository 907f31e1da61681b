import { OutboxMessage } from '../../../models'
import type { OutboxStatus } from '../../../models/outbox-message'

/** The mail this enquiry sent, for the desk: each message's delivery state, attempts and last error. */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const enquiry = await findEnquiryFor(event, caller)
  const rows = await OutboxMessage.findAll({
    where: { enquiryId: enquiry.id },
    attributes: { exclude: ['textBody', 'htmlBody', 'headers'] },
    order: [['id', 'ASC']],
  })
  return {
    ref: enquiry.ref,
    messages: rows.map(m => ({
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
    })),
    failed: rows.filter(m => m.status === 'failed').length,
  }
})
