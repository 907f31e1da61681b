import { thicknessForTargetUSchema, thicknessForTargetU } from '../../../shared/calc'

/** Least insulation thickness for a target U, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(thicknessForTargetUSchema))
  return runCalc(() => thicknessForTargetU(input))
})
