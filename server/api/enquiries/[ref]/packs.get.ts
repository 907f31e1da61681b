import { packNeedsCheck } from '../../../../shared/schemas/pack'
import { ResponsePack } from '../../../models'

/** An enquiry's response packs, newest first: staff see every one, the requester's side the issued ones. */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const enquiry = await findEnquiryFor(event, caller)
  const staff = isStaff(caller)
  const packs = await ResponsePack.findAll({
    where: { enquiryId: enquiry.id, ...(staff ? {} : { status: 'issued' }) },
    include: ['officer', 'checker', 'attachment'],
    order: [['revision', 'DESC']],
  })
  return {
    ref: enquiry.ref,
    topic: enquiry.topic,
    needsCheck: packNeedsCheck(enquiry.topic),
    packs: packs.map(p => publicPack(p, enquiry.ref)),
  }
})
