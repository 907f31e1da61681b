import { OutboxMessage } from '../../../models'

/** The mail this enquiry sent, for the desk: each message's delivery state, attempts and last error. */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const enquiry = await findEnquiryFor(event, caller)
  const rows = await OutboxMessage.findAll({
    where: { enquiryId: enquiry.id },
    attributes: outboxListAttributes,
    order: [['id', 'ASC']],
  })
  return {
    ref: enquiry.ref,
    messages: rows.map(outboxView),
    failed: rows.filter(m => m.status === 'failed').length,
  }
})
