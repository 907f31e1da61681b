import { mergeInputSchema } from '../../../../shared/schemas/enquiry'
import { Attachment, Enquiry, EnquiryEvent, EnquiryMessage } from '../../../models'

/** Folds a duplicate into another enquiry: its thread and files move across; the duplicate closes, pointing to it. */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const { intoRef } = await readValidatedBody(event, parseWith(mergeInputSchema))
  const db = useDb()
  const result = await db.transaction(async (transaction) => {
    const source = await findEnquiryFor(event, caller, { transaction, lock: true })
    if (source.ref === intoRef) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'intoRef: An enquiry cannot be merged into itself.' })
    const target = await Enquiry.findOne({ where: { ref: intoRef }, transaction, lock: transaction.LOCK.UPDATE })
    if (!target) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: `intoRef: There is no enquiry ${intoRef}.` })
    if (source.mergedIntoId || target.mergedIntoId) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'One of these enquiries was already merged into another.' })
    const now = new Date()
    const [moved] = await EnquiryMessage.update({ enquiryId: target.id }, { where: { enquiryId: source.id }, transaction })
    const [files] = await Attachment.update({ enquiryId: target.id }, { where: { enquiryId: source.id }, transaction })
    // The duplicate's own question joins the target's thread as a message from its requester.
    await EnquiryMessage.create({
      enquiryId: target.id, kind: 'requester', authorUserId: source.requesterUserId, authorName: source.requesterName,
      body: `(Merged from ${source.ref}: ${source.subject})\n\n${source.question}`, source: 'web', createdAt: source.receivedAt,
    }, { transaction })
    await EnquiryEvent.bulkCreate([
      { enquiryId: source.id, actorUserId: caller.id, kind: 'merged', fromValue: source.ref, toValue: target.ref, createdAt: now },
      { enquiryId: source.id, actorUserId: caller.id, kind: 'status', fromValue: source.status, toValue: 'closed', createdAt: now },
      { enquiryId: target.id, actorUserId: caller.id, kind: 'merged', fromValue: source.ref, toValue: target.ref, createdAt: now },
    ], { transaction })
    source.status = 'closed'
    source.closedAt = now
    source.mergedIntoId = target.id
    source.lastActivityAt = now
    await refreshDueTimes(source, transaction)
    await source.save({ transaction })
    target.lastActivityAt = now
    await target.save({ transaction })
    return { from: source.ref, into: target.ref, messages: moved, attachments: files }
  })
  return { merged: result }
})
