import { mouldRiskSchema, mouldRisk } from '../../../shared/calc'

/** Surface mould check by the temperature factor fRsi, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(mouldRiskSchema))
  return runCalc(() => mouldRisk(input))
})
