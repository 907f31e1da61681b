import { wallQuantities, wallQuantitiesInput } from '../../../shared/calc'

/** Material take-off for the wall and its ETICS, with the waste allowance of each line, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(wallQuantitiesInput))
  return runCalc(() => wallQuantities(input))
})
