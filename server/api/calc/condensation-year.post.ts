import { condensationYearSchema, condensationYear } from '../../../shared/calc'

/** Monthly interstitial condensation assessment over a year (EN ISO 13788), for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(condensationYearSchema))
  return runCalc(() => condensationYear(input))
})
