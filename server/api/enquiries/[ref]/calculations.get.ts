import { enquiryRefSchema } from '../../../../shared/schemas/enquiry'
import { Calculation, Enquiry, User } from '../../../models'

/** The calculations saved to an enquiry, oldest first, for staff and for the enquiry's own organisation. */
export default defineEventHandler(async (event) => {
  const caller = await requireCaller(event)
  const { ref } = await getValidatedRouterParams(event, parseWith(enquiryRefSchema))
  useDb()
  const enquiry = await Enquiry.findOne({ where: { ref, ...enquiryScope(caller) } })
  if (!enquiry) notFound('enquiry')
  const rows = await Calculation.findAll({
    where: { enquiryId: enquiry.id },
    include: [{ model: User, as: 'author', attributes: ['id', 'name'] }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
    limit: 500,
  })
  return { calculations: rows.map(c => publicCalculation(c, enquiry.ref)) }
})
