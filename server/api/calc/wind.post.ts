import { windAnchors, windAnchorsSchema } from '../../../shared/workbench/wind-anchors'

/** Wind on a facade and the insulation anchors per zone (EN 1991-1-4), for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(windAnchorsSchema))
  return runCalc(() => windAnchors(input))
})
