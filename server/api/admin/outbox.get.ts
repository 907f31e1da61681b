import { fn, col } from 'sequelize'
import { outboxQuerySchema } from '../../../shared/schemas/mail'
import { Enquiry, OutboxMessage } from '../../models'
import type { OutboxStatus } from '../../models/outbox-message'

/** The outbox for administrators: what is waiting, what went, what the worker gave up on and why. */
export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  const { status, page } = await getValidatedQuery(event, parseWith(outboxQuerySchema))
  useDb()
  const pageSize = 50
  const [rows, total, counts] = await Promise.all([
    OutboxMessage.findAll({
      where: status ? { status } : {},
      attributes: { exclude: ['textBody', 'htmlBody', 'headers'] },
      order: [['id', 'DESC']],
      limit: pageSize,
      offset: (page - 1) * pageSize,
    }),
    OutboxMessage.count({ where: status ? { status } : {} }),
    OutboxMessage.findAll({ attributes: ['status', [fn('COUNT', col('id')), 'n']], group: ['status'], raw: true }) as unknown as Promise<{ status: string, n: number }[]>,
  ])
  const enquiryIds = [...new Set(rows.map(r => r.enquiryId).filter((id): id is number => !!id))]
  const refs = new Map((enquiryIds.length ? await Enquiry.findAll({ where: { id: enquiryIds }, attributes: ['id', 'ref'] }) : []).map(e => [e.id, e.ref]))
  return {
    messages: rows.map(m => ({
      id: Number(m.id),
      kind: m.kind,
      toAddress: m.toAddress,
      subject: m.subject,
      messageId: m.messageId,
      enquiryRef: m.enquiryId ? refs.get(m.enquiryId) ?? null : null,
      status: m.status as OutboxStatus,
      attempts: m.attempts,
      nextAttemptAt: m.nextAttemptAt,
      lastError: m.lastError,
      sentAt: m.sentAt,
      createdAt: m.createdAt,
    })),
    countsByStatus: Object.fromEntries(counts.map(c => [c.status, Number(c.n)])) as Record<string, number>,
    total,
    page,
    pageSize,
  }
})
