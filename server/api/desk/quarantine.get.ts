import { quarantineQuerySchema } from '../../../shared/schemas/mail'
import { Enquiry, InboundQuarantine, User } from '../../models'
import type { QuarantineStatus } from '../../models/inbound-quarantine'

/** Mail held for an officer's decision (or, with ?status=, what was decided), newest first. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const { status, page } = await getValidatedQuery(event, parseWith(quarantineQuerySchema))
  useDb()
  const pageSize = 25
  const [rows, total] = await Promise.all([
    InboundQuarantine.findAll({ where: { status }, order: [['id', 'DESC']], limit: pageSize, offset: (page - 1) * pageSize }),
    InboundQuarantine.count({ where: { status } }),
  ])
  const enquiryIds = [...new Set(rows.map(r => r.enquiryId).filter((id): id is number => !!id))]
  const deciderIds = [...new Set(rows.map(r => r.decidedBy).filter((id): id is number => !!id))]
  const [enquiries, deciders] = await Promise.all([
    enquiryIds.length ? Enquiry.findAll({ where: { id: enquiryIds }, attributes: ['id', 'ref', 'subject'] }) : [],
    deciderIds.length ? User.findAll({ where: { id: deciderIds }, attributes: ['id', 'name'] }) : [],
  ])
  const enquiryOf = new Map(enquiries.map(e => [e.id, { ref: e.ref, subject: e.subject }]))
  const nameOf = new Map(deciders.map(u => [u.id, u.name]))
  return {
    mails: rows.map(r => ({
      id: r.id,
      receivedAt: r.receivedAt,
      fromAddress: r.fromAddress,
      toAddresses: r.toAddresses,
      subject: r.subject,
      reason: r.reason,
      rawSize: r.rawSize,
      text: r.textBody.length > 20_000 ? `${r.textBody.slice(0, 20_000)}…` : r.textBody,
      attachments: r.attachmentList ? JSON.parse(r.attachmentList) as { name: string, contentType: string, size: number }[] : [],
      enquiry: r.enquiryId ? enquiryOf.get(r.enquiryId) ?? null : null,
      status: r.status as QuarantineStatus,
      decidedBy: r.decidedBy ? nameOf.get(r.decidedBy) ?? null : null,
      decidedAt: r.decidedAt,
    })),
    total,
    page,
    pageSize,
  }
})
