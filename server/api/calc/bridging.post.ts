import { bridgingHeatLossSchema, bridgingHeatLoss } from '../../../shared/calc'

/** Heat loss through junctions (Σψ·L) and the y-value against the defaults, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(bridgingHeatLossSchema))
  return runCalc(() => bridgingHeatLoss(input))
})
