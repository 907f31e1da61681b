import { Quotation, User } from '../../../models'

/** The quotation revisions of an enquiry, A first, for staff and for the enquiry's own organisation. */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const enquiry = await findEnquiryFor(event, caller)
  const rows = await Quotation.findAll({
    where: { enquiryId: enquiry.id },
    include: [{ model: User, as: 'author', attributes: ['id', 'name'] }],
    order: [['revision', 'ASC']],
  })
  return { quotations: rows.map(q => publicQuotation(q, enquiry.ref)) }
})
