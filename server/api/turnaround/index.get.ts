import { turnaroundQuerySchema } from '../../../shared/schemas/turnaround'

/** The manager's turnaround figures for a period and filters. Officers see their own figures on the desk. */
export default defineEventHandler(async (event) => {
  await requireManager(event)
  const query = await getValidatedQuery(event, parseWith(turnaroundQuerySchema))
  return turnaroundFigures(query)
})
