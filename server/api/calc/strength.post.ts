import { wallStrength, wallStrengthSchema } from '../../../shared/workbench/wall-strength'

/** Vertical resistance of a single-leaf wall (EN 772-1, EN 1996-1-1, EN 1996-3), for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(wallStrengthSchema))
  return runCalc(() => wallStrength(input))
})
