import { z } from 'zod'
import { quarantineDecisionSchema } from '../../../../shared/schemas/mail'
import { Enquiry, InboundQuarantine } from '../../../models'

const paramsSchema = z.object({ id: z.coerce.number().int().positive() })

/**
 * An officer decides on a held mail: "attach" threads it onto the enquiry they name as the requester's
 * message (attachments checked as on arrival, the enquiry moved on as for any answer), "discard" drops it.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const { id } = await getValidatedRouterParams(event, parseWith(paramsSchema))
  const decision = await readValidatedBody(event, parseWith(quarantineDecisionSchema))
  useDb()
  const row = await InboundQuarantine.findByPk(id)
  if (!row) notFound('held mail')
  const decided = () => createError({ statusCode: 409, statusMessage: 'Conflict', message: `This mail was already ${row.status}.` })
  if (row.status !== 'held') throw decided()

  if (decision.action === 'discard') {
    const [changed] = await InboundQuarantine.update({ status: 'discarded', decidedBy: caller.id, decidedAt: new Date() }, { where: { id, status: 'held' } })
    if (!changed) throw decided()
    if (row.rawKey) await removeStored([row.rawKey])
    await recordAudit(event, { actorUserId: caller.id, action: 'inbound.discard', subjectType: 'inbound_quarantine', subjectId: id })
    return { id, status: 'discarded' }
  }

  const enquiry = await Enquiry.findOne({ where: { ref: decision.ref } })
  if (!enquiry) notFound('enquiry')
  if (enquiry.mergedIntoId) {
    const into = await Enquiry.findByPk(enquiry.mergedIntoId, { attributes: ['ref'] })
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${enquiry.ref} was merged into ${into?.ref ?? 'another enquiry'}; attach the mail there.` })
  }
  const threaded = await releaseHeldMail(row, enquiry, caller.id)
  if (!threaded) throw decided()
  await recordAudit(event, { actorUserId: caller.id, action: 'inbound.attach', subjectType: 'inbound_quarantine', subjectId: id, detail: { ref: enquiry.ref, messageId: threaded.messageId } })
  return { id, status: 'released', ...threaded }
})
