import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import { enquiryRefSchema } from '../../shared/schemas/enquiry'
import { Enquiry } from '../models'
import type { Caller } from './access'

/** The enquiry named in the route, if the caller may see it — else the same 404 as for one that does not exist. */
export async function findEnquiryFor(event: H3Event, caller: Caller, options: { transaction?: Transaction, lock?: boolean } = {}): Promise<Enquiry> {
  const { ref } = await getValidatedRouterParams(event, parseWith(enquiryRefSchema))
  useDb()
  const enquiry = await Enquiry.findOne({
    where: { ref, ...enquiryScope(caller) },
    transaction: options.transaction,
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
  })
  if (!enquiry) notFound('enquiry')
  return enquiry
}
