import { packIdParamsSchema } from '../../../../shared/schemas/pack'
import { Enquiry, ResponsePack } from '../../../models'

/**
 * A second officer's check: approving a pack that awaits it issues it, with the approver named as its
 * checker. The author cannot check their own pack; a pack that names its checker waits for that person.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const { id } = await getValidatedRouterParams(event, parseWith(packIdParamsSchema))
  const db = useDb()
  const stored: string[] = []
  try {
    const result = await db.transaction(async (transaction) => {
      const found = await ResponsePack.findByPk(id, { transaction })
      if (!found) notFound('response pack')
      // Lock the enquiry first, then re-read the pack under it, in the same order as composing does.
      const enquiry = await Enquiry.findByPk(found.enquiryId, { transaction, lock: transaction.LOCK.UPDATE })
      const pack = await ResponsePack.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE })
      if (!enquiry || !pack) notFound('response pack')
      if (pack.status !== 'awaiting-check') throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Revision ${pack.revision} is not awaiting a check (it is ${pack.status}).` })
      if (pack.officerId === caller.id) throw createError({ statusCode: 403, statusMessage: 'A second officer checks this pack', message: 'The author of a pack cannot check it.' })
      if (pack.checkerId && pack.checkerId !== caller.id) throw createError({ statusCode: 403, statusMessage: 'Not the nominated checker', message: 'This pack waits for the officer its author named as checker.' })
      if (enquiry.mergedIntoId) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This enquiry was merged into another; compose the pack on that one.' })
      await issuePack(event, pack, enquiry, caller.id, transaction, stored)
      await recordAudit(event, { actorUserId: caller.id, action: 'pack.approved', subjectType: 'enquiry', subjectId: enquiry.id, detail: { packId: pack.id, revision: pack.revision } }, transaction)
      return { id: pack.id, ref: enquiry.ref }
    })
    const full = await ResponsePack.findByPk(result.id, { include: ['officer', 'checker', 'attachment'] })
    return { pack: publicPack(full!, result.ref) }
  }
  catch (error) {
    await removeStored(stored)
    throw error
  }
})
