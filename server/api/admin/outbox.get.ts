import { fn, col } from 'sequelize'
import { outboxQuerySchema } from '../../../shared/schemas/mail'
import { Enquiry, OutboxMessage } from '../../models'

/** The outbox for administrators: what is waiting, what went, what the worker gave up on and why. */
export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  const { status, page } = await getValidatedQuery(event, parseWith(outboxQuerySchema))
  useDb()
  const pageSize = 50
  const [rows, counts] = await Promise.all([
    OutboxMessage.findAll({
      where: status ? { status } : {},
      attributes: outboxListAttributes,
      order: [['id', 'DESC']],
      limit: pageSize,
      offset: (page - 1) * pageSize,
    }),
    OutboxMessage.findAll({ attributes: ['status', [fn('COUNT', col('id')), 'n']], group: ['status'], raw: true }) as unknown as Promise<{ status: string, n: number }[]>,
  ])
  const countsByStatus = Object.fromEntries(counts.map(c => [c.status, Number(c.n)])) as Record<string, number>
  // The total comes from the per-status counts already read, not from a third query.
  const total = status ? countsByStatus[status] ?? 0 : Object.values(countsByStatus).reduce((sum, n) => sum + n, 0)
  const enquiryIds = [...new Set(rows.map(r => r.enquiryId).filter((id): id is number => !!id))]
  const refs = new Map((enquiryIds.length ? await Enquiry.findAll({ where: { id: enquiryIds }, attributes: ['id', 'ref'] }) : []).map(e => [e.id, e.ref]))
  return {
    messages: rows.map(m => ({ ...outboxView(m), enquiryRef: m.enquiryId ? refs.get(m.enquiryId) ?? null : null })),
    countsByStatus,
    total,
    page,
    pageSize,
  }
})
