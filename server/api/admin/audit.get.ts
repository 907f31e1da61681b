import { z } from 'zod'
import { AuditEvent } from '../../models'

const querySchema = z.object({
  action: z.string().trim().max(40).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
})

export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  const { action, page } = await getValidatedQuery(event, parseWith(querySchema))
  useDb()
  const pageSize = 100
  const rows = await AuditEvent.findAll({
    where: action ? { action } : {},
    order: [['id', 'DESC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  })
  return {
    events: rows.map(r => ({ id: r.id, actorUserId: r.actorUserId, action: r.action, subjectType: r.subjectType, subjectId: r.subjectId, detail: r.detail ? JSON.parse(r.detail) : null, ip: r.ip, createdAt: r.createdAt })),
    page,
    pageSize,
  }
})
