import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../../shared/calc/errors'
import { PROGRAMME_DEFAULTS, buildProgramme, type BuildProgrammeInput } from '../../../shared/calc/programme'
import { buildProgrammeInput } from '../../../shared/calc/schemas2'

describe('programme defaults', () => {
  it.each<[keyof typeof PROGRAMME_DEFAULTS, number]>([
    // common practice: a storey height a day on thin-layer mortar, about 1.5 m a day on conventional mortar
    ['thinJointHeightPerDay_m', 3.0],
    ['conventionalHeightPerDay_m', 1.5],
    // common practice: thin joints about 3 mm against 10 mm conventional joints
    ['thinJointJoint_mm', 3],
    ['cavityJoint_mm', 10],
  ])('%s defaults to %s (common practice)', (key, value) => {
    expect(PROGRAMME_DEFAULTS[key]).toBe(value)
  })

  it('marks every default as common practice and every override as the user’s', () => {
    const r = buildProgramme({ area_m2: 600, storeys: 3, gangs: 2, assumptions: { thinJointRate_m2PerGangDay: 25 } })
    for (const a of r.assumptions) {
      expect(a.basis).toBe(a.key === 'thinJointRate_m2PerGangDay' ? 'user' : 'common practice')
    }
    expect(r.assumptions.find((a) => a.key === 'thinJointRate_m2PerGangDay')!.value).toBe(25)
  })
})

describe('buildProgramme', () => {
  // Derived by hand with the defaults: 600 m², 3 storeys (200 m² each), 2 gangs, 2.7 m storeys.
  // Single leaf: course 215 + 3 = 218 mm → 2700/218 = 12.39 → 13 courses per storey; 200/(20·2) = 5 days per storey
  //   (height limit: 2.7/3.0 → 1 day) → 15 days.
  // Cavity: course 215 + 10 = 225 mm → 12 courses per leaf per storey; 2·200/(15·2) = 13.33 days per storey
  //   (height limit: 2.7/1.5 → 2 days) → 40 days.
  const input: BuildProgrammeInput = { area_m2: 600, storeys: 3, gangs: 2 }

  it.each<['singleLeaf' | 'cavity', number, number, number, number, number]>([
    ['singleLeaf', 1, 13, 39, 39, 15],
    ['cavity', 2, 12, 36, 72, 40],
  ])('%s: %s leaf/leaves, %s courses per leaf per storey, %s per leaf, %s in all, %s days (derived by hand)', (key, leaves, perStorey, perLeaf, total, days) => {
    const r = buildProgramme(input)[key]
    expect(r.leaves).toBe(leaves)
    expect(r.coursesPerLeafPerStorey).toBe(perStorey)
    expect(r.coursesPerLeaf).toBe(perLeaf)
    expect(r.totalCourses).toBe(total)
    expect(r.days).toBe(days)
    expect(r.governs).toBe('laying-rate')
  })

  it('reports the days saved (derived by hand: 40 − 15)', () => {
    expect(buildProgramme(input).daysSaved).toBe(25)
  })

  it('a single leaf has half the courses of a two-leaf wall of the same height (common practice)', () => {
    // Same course height in both so that only the number of leaves differs.
    const r = buildProgramme({ ...input, assumptions: { thinJointUnitHeight_mm: 215, thinJointJoint_mm: 10 } })
    expect(r.singleLeaf.totalCourses * 2).toBe(r.cavity.totalCourses)
    expect(r.singleLeaf.coursesPerLeaf).toBe(r.cavity.coursesPerLeaf)
  })

  it('lets the height-per-day limit govern a short wall (derived by hand)', () => {
    // 10 m², 1 storey, 1 gang: cavity by rate 2·10/15 = 1.33 days, by height 2.7/1.5 → 2 days.
    const r = buildProgramme({ area_m2: 10, storeys: 1, gangs: 1 })
    expect(r.cavity.daysPerStoreyByRate).toBeCloseTo(4 / 3, 12)
    expect(r.cavity.governs).toBe('height-per-day')
    expect(r.cavity.days).toBe(2)
    expect(r.singleLeaf.days).toBe(1)
  })

  it('more gangs shorten the programme while the laying rate governs', () => {
    const one = buildProgramme({ ...input, gangs: 1 })
    const four = buildProgramme({ ...input, gangs: 4 })
    expect(one.singleLeaf.days).toBe(30) // 200/20 = 10 per storey × 3
    expect(four.singleLeaf.days).toBe(8) // 200/80 = 2.5 per storey × 3 = 7.5 → 8
  })

  it.each<[string, Partial<BuildProgrammeInput>, string]>([
    ['zero area', { area_m2: 0 }, 'area_m2'],
    ['zero storeys', { storeys: 0 }, 'storeys'],
    ['fractional gangs', { gangs: 1.5 }, 'gangs'],
    ['negative laying rate', { assumptions: { cavityLeafRate_m2PerGangDay: -3 } }, 'assumptions.cavityLeafRate_m2PerGangDay'],
    ['NaN storey height', { assumptions: { storeyHeight_m: Number.NaN } }, 'assumptions.storeyHeight_m'],
  ])('rejects %s', (_n, change, field) => {
    try {
      buildProgramme({ ...input, ...change })
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })

  it('the schema agrees on whole storeys and gangs', () => {
    expect(buildProgrammeInput.safeParse(input).success).toBe(true)
    expect(buildProgrammeInput.safeParse({ ...input, gangs: 1.5 }).success).toBe(false)
  })
})
