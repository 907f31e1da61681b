import { buildProgramme, buildProgrammeInput } from '../../../shared/calc'

/** Masonry days, single-leaf thin-joint against a two-leaf cavity wall, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(buildProgrammeInput))
  return runCalc(() => buildProgramme(input))
})
