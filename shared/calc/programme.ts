/**
 * Masonry programme: days to build the external walls as a single-leaf thin-joint wall against a two-leaf cavity
 * wall with conventional mortar. Every rate is an editable assumption; the defaults are common practice.
 */
import { CalcInputError, requirePositive, requireRange } from './errors'

export interface ProgrammeAssumptions {
  /** Storey height of wall laid per storey (m). */
  storeyHeight_m: number
  /** Thin-joint unit height and joint (mm): course height = unit + joint. */
  thinJointUnitHeight_mm: number
  thinJointJoint_mm: number
  /** Conventional unit height and joint (mm), both leaves of the cavity wall. */
  cavityUnitHeight_mm: number
  cavityJoint_mm: number
  /** Laying rate of one gang, m² of wall face per day. */
  thinJointRate_m2PerGangDay: number
  cavityLeafRate_m2PerGangDay: number
  /** Height a section of wall may rise in one day before the mortar must stiffen. */
  thinJointHeightPerDay_m: number
  conventionalHeightPerDay_m: number
}

/** Common-practice defaults (no published source): thin-layer mortar carries load within hours, general-purpose mortar limits a day's lift to about 1.5 m. */
export const PROGRAMME_DEFAULTS: Readonly<ProgrammeAssumptions> = {
  storeyHeight_m: 2.7,
  thinJointUnitHeight_mm: 215,
  thinJointJoint_mm: 3,
  cavityUnitHeight_mm: 215,
  cavityJoint_mm: 10,
  thinJointRate_m2PerGangDay: 20,
  cavityLeafRate_m2PerGangDay: 15,
  thinJointHeightPerDay_m: 3.0,
  conventionalHeightPerDay_m: 1.5,
}

const ASSUMPTION_META: Record<keyof ProgrammeAssumptions, { label: string; unit: string }> = {
  storeyHeight_m: { label: 'Storey height of wall', unit: 'm' },
  thinJointUnitHeight_mm: { label: 'Thin-joint unit height', unit: 'mm' },
  thinJointJoint_mm: { label: 'Thin-layer bed joint', unit: 'mm' },
  cavityUnitHeight_mm: { label: 'Cavity-wall unit height (each leaf)', unit: 'mm' },
  cavityJoint_mm: { label: 'Conventional bed joint', unit: 'mm' },
  thinJointRate_m2PerGangDay: { label: 'Thin-joint laying rate per gang', unit: 'm²/day' },
  cavityLeafRate_m2PerGangDay: { label: 'Cavity leaf laying rate per gang', unit: 'm²/day' },
  thinJointHeightPerDay_m: { label: 'Height per day on thin-layer mortar', unit: 'm' },
  conventionalHeightPerDay_m: { label: 'Height per day on conventional mortar', unit: 'm' },
}

export interface BuildProgrammeInput {
  /** Net external wall area over all storeys (m²). */
  area_m2: number
  storeys: number
  gangs: number
  /** Overrides of the defaults; anything given is marked as the user's. */
  assumptions?: Partial<ProgrammeAssumptions>
}

export interface ProgrammeOption {
  leaves: 1 | 2
  /** Courses in one leaf over one storey. */
  coursesPerLeafPerStorey: number
  /** Courses in one leaf over the building height. */
  coursesPerLeaf: number
  /** Courses laid in total (all leaves, all storeys). */
  totalCourses: number
  /** Days per storey by laying rate and by the height-per-day limit; the larger governs. */
  daysPerStoreyByRate: number
  daysPerStoreyByHeight: number
  daysPerStorey: number
  governs: 'laying-rate' | 'height-per-day'
  /** Whole working days for the masonry. */
  days: number
}

export interface ProgrammeResult {
  singleLeaf: ProgrammeOption
  cavity: ProgrammeOption
  /** cavity.days − singleLeaf.days */
  daysSaved: number
  assumptions: Array<{ key: keyof ProgrammeAssumptions; label: string; value: number; unit: string; basis: 'common practice' | 'user' }>
  notes: string[]
}

function option(
  leaves: 1 | 2,
  areaPerStorey: number,
  storeys: number,
  gangs: number,
  storeyHeight: number,
  courseHeight_mm: number,
  ratePerLeaf: number,
  heightPerDay: number,
): ProgrammeOption {
  // The top course is cut to fit, so part of a course counts as a course.
  const coursesPerLeafPerStorey = Math.ceil((storeyHeight * 1000) / courseHeight_mm - 1e-9)
  const daysPerStoreyByRate = (areaPerStorey * leaves) / (ratePerLeaf * gangs)
  // Each lift must stiffen overnight before the next goes on, whatever the gang size.
  const daysPerStoreyByHeight = Math.ceil(storeyHeight / heightPerDay - 1e-9)
  const daysPerStorey = Math.max(daysPerStoreyByRate, daysPerStoreyByHeight)
  return {
    leaves,
    coursesPerLeafPerStorey,
    coursesPerLeaf: coursesPerLeafPerStorey * storeys,
    totalCourses: coursesPerLeafPerStorey * storeys * leaves,
    daysPerStoreyByRate,
    daysPerStoreyByHeight,
    daysPerStorey,
    governs: daysPerStoreyByRate >= daysPerStoreyByHeight ? 'laying-rate' : 'height-per-day',
    days: Math.ceil(daysPerStorey * storeys - 1e-9),
  }
}

/**
 * Masonry days for a single-leaf thin-joint wall and for a two-leaf cavity wall of the same area. Storeys are
 * built one after another (each needs its floor); within a storey the time is the larger of area ÷ (rate × gangs)
 * and the lifts the height-per-day limit forces. A rough planning aid with common-practice defaults, not a
 * contract programme.
 */
export function buildProgramme(input: BuildProgrammeInput): ProgrammeResult {
  const area = requirePositive('area_m2', input.area_m2)
  const storeys = requireRange('storeys', input.storeys, 1, 100)
  if (!Number.isInteger(storeys)) throw new CalcInputError('storeys', 'storeys must be a whole number')
  const gangs = requireRange('gangs', input.gangs, 1, 100)
  if (!Number.isInteger(gangs)) throw new CalcInputError('gangs', 'gangs must be a whole number')

  const given = input.assumptions ?? {}
  const a = { ...PROGRAMME_DEFAULTS } as ProgrammeAssumptions
  for (const key of Object.keys(ASSUMPTION_META) as Array<keyof ProgrammeAssumptions>) {
    const v = given[key]
    if (v === undefined) continue
    a[key] = key.endsWith('Joint_mm') ? requireRange(`assumptions.${key}`, v, 0, 30) : requirePositive(`assumptions.${key}`, v)
  }

  const areaPerStorey = area / storeys
  const singleLeaf = option(1, areaPerStorey, storeys, gangs, a.storeyHeight_m, a.thinJointUnitHeight_mm + a.thinJointJoint_mm, a.thinJointRate_m2PerGangDay, a.thinJointHeightPerDay_m)
  const cavity = option(2, areaPerStorey, storeys, gangs, a.storeyHeight_m, a.cavityUnitHeight_mm + a.cavityJoint_mm, a.cavityLeafRate_m2PerGangDay, a.conventionalHeightPerDay_m)

  const assumptions = (Object.keys(ASSUMPTION_META) as Array<keyof ProgrammeAssumptions>).map((key) => ({
    key,
    label: ASSUMPTION_META[key].label,
    value: a[key],
    unit: ASSUMPTION_META[key].unit,
    basis: given[key] === undefined ? ('common practice' as const) : ('user' as const),
  }))
  return {
    singleLeaf,
    cavity,
    daysSaved: cavity.days - singleLeaf.days,
    assumptions,
    notes: [
      'Masonry only: cavity insulation, ties, ETICS and render are not in these days.',
      'Rates and lift heights are common practice defaults; replace them with the contractor’s own figures.',
    ],
  }
}
