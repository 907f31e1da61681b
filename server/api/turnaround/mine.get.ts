import { turnaroundQuerySchema } from '../../../shared/schemas/turnaround'

/** The caller's own figures: open work assigned to them, answers given in the period, median time to answer. */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const query = await getValidatedQuery(event, parseWith(turnaroundQuerySchema))
  return officerOwnFigures(caller.id, query)
})
