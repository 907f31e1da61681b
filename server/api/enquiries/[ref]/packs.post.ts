import { nextPackRevision, packInputSchema } from '../../../../shared/schemas/pack'
import { ResponsePack } from '../../../models'

/**
 * Composes the next revision of an enquiry's response pack. A pack whose topic asks for a second officer's
 * check, or for which the author named a checker, waits for that check; any other is issued at once
 * (PDF stored, reply written and mailed with the PDF, enquiry answered).
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(packInputSchema))
  const db = useDb()
  const stored: string[] = []
  try {
    const { pack, ref } = await db.transaction(async (transaction) => {
      const enquiry = await findEnquiryFor(event, caller, { transaction, lock: true })
      if (enquiry.mergedIntoId) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This enquiry was merged into another; answer that one instead.' })
      if (!enquiry.replyToken) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This enquiry has no reply address to send the pack to.' })
      const resolved = await resolvePackInput(event, enquiry, caller, input, transaction)
      const waiting = await ResponsePack.count({ where: { enquiryId: enquiry.id, status: 'awaiting-check' }, transaction })
      if (waiting) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'An earlier pack is still awaiting its check; have it approved first.' })
      const last = await ResponsePack.findOne({ where: { enquiryId: enquiry.id }, order: [['revision', 'DESC']], attributes: ['revision'], transaction })
      let revision: string
      try { revision = nextPackRevision(last?.revision ?? null) }
      catch (error) { throw createError({ statusCode: 409, statusMessage: 'Conflict', message: (error as Error).message }) }
      const mustWait = resolved.needsCheck || resolved.checkerId !== null
      const pack = await ResponsePack.create({
        enquiryId: enquiry.id,
        revision,
        messageId: null,
        attachmentId: null,
        officerId: caller.id,
        checkerId: resolved.checkerId,
        status: mustWait ? 'awaiting-check' : 'draft',
        replyBody: input.replyBody,
        items: JSON.stringify(resolved.items),
        calculationIds: JSON.stringify(resolved.calculations.map(c => c.id)),
        quotationIds: JSON.stringify(resolved.quotations.map(q => q.id)),
        cautions: JSON.stringify(resolved.cautions),
        createdAt: new Date(),
        issuedAt: null,
      }, { transaction })
      if (!mustWait) await issuePack(event, pack, enquiry, null, transaction, stored)
      else {
        enquiry.lastActivityAt = new Date()
        await enquiry.save({ transaction })
      }
      await recordAudit(event, {
        actorUserId: caller.id,
        action: mustWait ? 'pack.composed' : 'pack.issued',
        subjectType: 'enquiry',
        subjectId: enquiry.id,
        detail: { packId: pack.id, revision, items: resolved.items.map(i => `${i.code} rev ${i.revision}`), calculationIds: resolved.calculations.map(c => c.id), quotationIds: resolved.quotations.map(q => q.id) },
      }, transaction)
      return { pack, ref: enquiry.ref }
    })
    const full = await ResponsePack.findByPk(pack.id, { include: ['officer', 'checker', 'attachment'] })
    setResponseStatus(event, 201)
    return { pack: publicPack(full ?? pack, ref) }
  }
  catch (error) {
    await removeStored(stored)
    throw error
  }
})
