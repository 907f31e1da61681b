import { condensationAtSchema, condensationAt } from '../../../shared/calc'

/** Steady-state Glaser profile for one set of conditions (EN ISO 13788), for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(condensationAtSchema))
  return runCalc(() => condensationAt(input))
})
