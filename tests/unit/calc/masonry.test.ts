import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../../shared/calc/errors'
import {
  MASONRY_ANNEX_PRESETS,
  MASONRY_ENGINEER_CAUTION,
  SHAPE_FACTOR_HEIGHTS_MM,
  SHAPE_FACTOR_WIDTHS_MM,
  characteristicStrength,
  masonryGammaMFromPreset,
  masonryKFromPreset,
  normalisedStrength,
  shapeFactor,
  verticalResistance,
  type VerticalResistanceInput,
} from '../../../shared/calc/masonry'
import { characteristicStrengthInput, verticalResistanceInput } from '../../../shared/calc/schemas2'

function expectInputError(fn: () => unknown, field: string) {
  try {
    fn()
    expect.unreachable('should have thrown')
  } catch (e) {
    expect(e).toBeInstanceOf(CalcInputError)
    expect((e as CalcInputError).field).toBe(field)
  }
}

describe('shape factor δ', () => {
  // value recalled from EN 772-1 Annex A, Table A.1 (height rows × least horizontal dimension columns, mm)
  const table: Array<[number, Array<number | null>]> = [
    [40, [0.8, 0.7, null, null, null]],
    [50, [0.85, 0.75, 0.7, null, null]],
    [65, [0.95, 0.85, 0.75, 0.7, 0.65]],
    [100, [1.15, 1.0, 0.9, 0.8, 0.75]],
    [150, [1.3, 1.2, 1.1, 1.0, 0.95]],
    [200, [1.45, 1.35, 1.25, 1.15, 1.1]],
    [250, [1.55, 1.45, 1.35, 1.25, 1.15]],
  ]
  const cells = table.flatMap(([h, row]) =>
    row.flatMap((v, i) => (v === null ? [] : [[h, SHAPE_FACTOR_WIDTHS_MM[i]!, v] as [number, number, number]])),
  )
  it.each(cells)('height %s mm, width %s mm → δ = %s (recalled: EN 772-1 Table A.1)', (h, w, delta) => {
    expect(shapeFactor(h, w)).toBeCloseTo(delta, 12)
  })

  it('covers the whole table', () => {
    expect(SHAPE_FACTOR_HEIGHTS_MM).toEqual([40, 50, 65, 100, 150, 200, 250])
    expect(cells).toHaveLength(30) // 35 cells less 5 empty ones
  })

  it.each<[number, number, number, string]>([
    // derived by hand, linear interpolation as EN 772-1 Annex A permits:
    [215, 100, 1.38, '1.35 + 0.3·(1.45 − 1.35)'],
    [215, 215, 1.1605, '0.49·1.15 + 0.21·1.10 + 0.21·1.25 + 0.09·1.15'],
    [100, 125, 0.95, '(1.00 + 0.90)/2'],
    [300, 400, 1.15, 'both sizes above 250 mm take the last cell'],
  ])('height %s, width %s → δ = %s (%s)', (h, w, delta) => {
    expect(shapeFactor(h, w)).toBeCloseTo(delta, 10)
  })

  it.each<[number, number, string]>([
    [30, 100, 'unitHeight_mm'],
    [100, 40, 'unitWidth_mm'],
    [40, 150, 'unitWidth_mm'], // empty cell of the table
    [45, 120, 'unitWidth_mm'], // interpolation would need an empty cell
    [Number.NaN, 100, 'unitHeight_mm'],
  ])('height %s, width %s has no shape factor', (h, w, field) => {
    expectInputError(() => shapeFactor(h, w), field)
  })
})

describe('normalised strength fb', () => {
  it.each<[string, number, number]>([
    // value recalled from EN 772-1 §7.3 / Annex A conversion factors
    ['air-dry', 1.0, 10.074],
    ['moisture-6pc', 1.0, 10.074],
    ['oven-dry', 0.8, 8.0592],
    ['water-soaked', 1.2, 12.0888],
  ])('7.3 N/mm² on a 215 × 100 mm specimen, %s (factor %s) → fb = %s (derived by hand: 7.3 × factor × 1.38)', (cond, factor, fb) => {
    const r = normalisedStrength({ meanStrength: 7.3, unitHeight_mm: 215, unitWidth_mm: 100, conditioning: cond as never })
    expect(r.conditioningFactor).toBe(factor)
    expect(r.shapeFactor).toBeCloseTo(1.38, 10)
    expect(r.fb).toBeCloseTo(fb, 9)
  })

  it('rejects an unknown conditioning and a zero strength', () => {
    expectInputError(() => normalisedStrength({ meanStrength: 7, unitHeight_mm: 215, unitWidth_mm: 100, conditioning: 'damp' as never }), 'conditioning')
    expectInputError(() => normalisedStrength({ meanStrength: 0, unitHeight_mm: 215, unitWidth_mm: 100, conditioning: 'air-dry' }), 'meanStrength')
  })
})

describe('characteristic strength fk', () => {
  it.each<[string, number, number | undefined, 'general' | 'thin-layer', number, number]>([
    // formula recalled from EN 1996-1-1 §3.6.1.2 (3.2): fk = K·fb^0.7·fm^0.3; derived by hand: 0.55·5.01187·1.51572 = 4.17812
    ['general, K 0.55, fb 10, fm 4 → fk 4.178', 10, 4, 'general', 0.55, 4.17812],
    // derived by hand: 0.75·5.01187·1.51572 = 5.69743 (K 0.75 recalled from the UK National Annex)
    ['general, K 0.75, fb 10, fm 4 → fk 5.697', 10, 4, 'general', 0.75, 5.69743],
    // formula recalled from EN 1996-1-1 §3.6.1.2 (3.3): fk = K·fb^0.85; derived by hand: 0.80·7.07946 = 5.66357
    ['thin-layer, K 0.80, fb 10 → fk 5.664', 10, undefined, 'thin-layer', 0.8, 5.66357],
    // derived by hand: 0.80·3.6^0.85 = 0.80·exp(0.85·1.280934) = 0.80·2.970689 = 2.37655
    ['thin-layer, K 0.80, fb 3.6 → fk 2.377', 3.6, undefined, 'thin-layer', 0.8, 2.37655],
  ])('%s', (_n, fb, fm, mortar, K, fk) => {
    const r = characteristicStrength({ fb, fm, mortar, K })
    expect(r.fk).toBeCloseTo(fk, 4)
    expect(r.K).toBe(K)
  })

  it('thin-layer mortar gives a higher fk than general-purpose mortar for the same low-strength unit', () => {
    // common practice: thin-joint walls of aggregate-concrete units gain strength from the thin bed
    const gp = characteristicStrength({ fb: 7, fm: 4, mortar: 'general', K: 0.55 }).fk
    const tl = characteristicStrength({ fb: 7, mortar: 'thin-layer', K: 0.8 }).fk
    expect(tl).toBeGreaterThan(gp)
  })

  it.each<[string, Parameters<typeof characteristicStrength>[0], number, number | null]>([
    // recalled: EN 1996-1-1 §3.6.1.2(2): fb ≤ 75 (general), ≤ 50 (thin-layer); fm ≤ min(20, 2·fb)
    ['fb capped at 75', { fb: 80, fm: 10, mortar: 'general', K: 0.55 }, 75, 10],
    ['fm capped at 20', { fb: 30, fm: 25, mortar: 'general', K: 0.55 }, 30, 20],
    ['fm capped at 2·fb', { fb: 3, fm: 10, mortar: 'general', K: 0.55 }, 3, 6],
    ['thin-layer fb capped at 50', { fb: 60, mortar: 'thin-layer', K: 0.8 }, 50, null],
  ])('%s', (_n, input, fbUsed, fmUsed) => {
    const r = characteristicStrength(input)
    expect(r.fbUsed).toBe(fbUsed)
    expect(r.fmUsed).toBe(fmUsed)
    expect(r.notes.length).toBeGreaterThan(0)
  })

  it('needs fm for general-purpose mortar and a sane K', () => {
    expectInputError(() => characteristicStrength({ fb: 10, mortar: 'general', K: 0.55 }), 'fm')
    expectInputError(() => characteristicStrength({ fb: 10, mortar: 'thin-layer', K: 0 }), 'K')
    expectInputError(() => characteristicStrength({ fb: 10, mortar: 'epoxy' as never, K: 0.5 }), 'mortar')
    expect(characteristicStrengthInput.safeParse({ fb: 10, mortar: 'general', K: 0.55 }).success).toBe(false)
    expect(characteristicStrengthInput.safeParse({ fb: 10, fm: 4, mortar: 'general', K: 0.55 }).success).toBe(true)
  })
})

describe('National Annex presets', () => {
  it.each<[string, 'aggregate-concrete' | 'calcium-silicate', 1 | 2, 'general' | 'thin-layer', number]>([
    // value recalled from EN 1996-1-1 Table 3.3 (recommended)
    ['en1996-recommended', 'aggregate-concrete', 1, 'general', 0.55],
    ['en1996-recommended', 'aggregate-concrete', 1, 'thin-layer', 0.8],
    ['en1996-recommended', 'aggregate-concrete', 2, 'general', 0.52],
    // value recalled from the UK National Annex to BS EN 1996-1-1 (labelled recalled, verify)
    ['uk-na-recalled', 'aggregate-concrete', 1, 'general', 0.75],
    ['uk-na-recalled', 'aggregate-concrete', 1, 'thin-layer', 0.8],
  ])('%s: K for %s Group %s in %s mortar is %s', (preset, unit, group, mortar, K) => {
    const r = masonryKFromPreset(preset, unit, group, mortar)
    expect(r.K).toBe(K)
    expect(r.source).toMatch(/recalled/)
  })

  it('finds a conditional K only when asked for it', () => {
    expect(masonryKFromPreset('uk-na-recalled', 'aggregate-concrete', 1, 'general', 'units laid flat').K).toBe(0.5)
  })

  it.each<[string, 'I' | 'II', string, 'designed' | 'prescribed' | undefined, number]>([
    // value recalled from the Note to EN 1996-1-1 §2.4.3(1)
    ['en1996-recommended', 'I', '1', 'designed', 1.5],
    ['en1996-recommended', 'I', '2', 'prescribed', 2.0],
    ['en1996-recommended', 'II', '3', undefined, 2.5],
    // value recalled from the UK National Annex Table NA.1 (verify)
    ['uk-na-recalled', 'I', '1', undefined, 2.3],
    ['uk-na-recalled', 'II', '2', undefined, 3.0],
  ])('%s: γM for category %s, class %s (%s) is %s', (preset, cat, cls, spec, gammaM) => {
    expect(masonryGammaMFromPreset(preset, cat, cls, spec).gammaM).toBe(gammaM)
  })

  it('labels every preset as recommended or recalled, and the recalled one says to verify', () => {
    for (const p of MASONRY_ANNEX_PRESETS) {
      expect(['recommended', 'recalled']).toContain(p.status)
      expect(p.source).toMatch(/recalled/)
    }
    expect(MASONRY_ANNEX_PRESETS.find((p) => p.id === 'uk-na-recalled')!.label).toMatch(/verify/)
  })

  it('throws for an unknown preset or a missing value', () => {
    expectInputError(() => masonryKFromPreset('mars', 'clay', 1, 'general'), 'presetId')
    expectInputError(() => masonryKFromPreset('uk-na-recalled', 'clay', 2, 'thin-layer'), 'K')
    expectInputError(() => masonryGammaMFromPreset('uk-na-recalled', 'I', '5'), 'gammaM')
  })
})

describe('vertical resistance', () => {
  // Worked case, derived by hand (EN 1996-1-1 §6.1.2 and Annex G, values recalled):
  // t = 200 mm, h = 2.7 m, ρ2 = 0.75 → hef = 2.025 m, hef/tef = 10.125 (≤ 15, so ek = 0); einit = 2025/450 = 4.5 mm.
  // Top: e = 20 + 4.5 = 24.5 ≥ 0.05t = 10 → Φtop = 1 − 49/200 = 0.755.
  // Bottom: e = 0 + 4.5 → raised to 10 → Φbottom = 1 − 20/200 = 0.900.
  // Mid: em = (20 + 0)/2 + 4.5 = 14.5; λ = 10.125·√(1/1000) = 0.320181; A1 = 1 − 29/200 = 0.855;
  //   u = (0.320181 − 0.063)/(0.73 − 1.17·0.0725) = 0.257181/0.645175 = 0.398621; Φm = 0.855·exp(−0.079449) = 0.789699.
  // fk = 4.0, γM = 2.5 → fd = 1.6 N/mm²; NRd = 0.755 · 200 · 1.6 = 241.6 kN/m (top governs).
  const worked: VerticalResistanceInput = {
    fk: 4,
    gammaM: 2.5,
    t_mm: 200,
    h_m: 2.7,
    rho: 0.75,
    topEccentricity_mm: 20,
    bottomEccentricity_mm: 0,
    method: 'annex-g',
  }

  it('Annex G worked case: Φ top/mid/bottom and NRd (derived by hand)', () => {
    const r = verticalResistance(worked)
    expect(r.hef_m).toBeCloseTo(2.025, 12)
    expect(r.slenderness).toBeCloseTo(10.125, 12)
    expect(r.eccentricities!.einit).toBeCloseTo(4.5, 12)
    expect(r.eccentricities!.ek).toBe(0)
    expect(r.phiTop).toBeCloseTo(0.755, 10)
    expect(r.phiBottom).toBeCloseTo(0.9, 10)
    expect(r.phiMid).toBeCloseTo(0.789699, 5)
    expect(r.phi).toBeCloseTo(0.755, 10)
    expect(r.governingSection).toBe('top')
    expect(r.fd).toBeCloseTo(1.6, 12)
    expect(r.NRd_kNm).toBeCloseTo(241.6, 8)
    expect(r.failedChecks).toEqual([])
    expect(r.caution).toBe(MASONRY_ENGINEER_CAUTION)
    expect(r.caution).toMatch(/chartered structural engineer/)
    expect(r.caution).not.toMatch(/complies|compliant|passes/i)
  })

  it('includes the creep eccentricity above hef/tef = 15 (derived by hand)', () => {
    // t = 150, h = 3.0, ρ = 1 → hef/tef = 20; einit = 6.667; em = 6.667 (no load eccentricity);
    // ek = 0.002·1.5·20·√(150·6.667) = 0.06·31.623 = 1.897; emk = 8.564; λ = 20/31.623 = 0.632456;
    // A1 = 1 − 2·8.564/150 = 0.885813; u = (0.632456 − 0.063)/(0.73 − 1.17·0.057094) = 0.858648; Φm = 0.612695.
    const r = verticalResistance({ ...worked, t_mm: 150, h_m: 3.0, rho: 1, topEccentricity_mm: 0 })
    expect(r.eccentricities!.ek).toBeCloseTo(1.89737, 4)
    expect(r.phiMid).toBeCloseTo(0.612695, 5)
    expect(r.phiTop).toBeCloseTo(0.9, 10) // e = max(6.667, 7.5) = 7.5 → 1 − 15/150
    expect(r.governingSection).toBe('mid')
  })

  it('simplified method: Φs = 0.85 − 0.0011·(hef/tef)² (recalled: EN 1996-3 §4.2.2.3; derived by hand)', () => {
    // Φs = 0.85 − 0.0011·10.125² = 0.85 − 0.112767 = 0.737233; NRd = 0.737233·200·1.6 = 235.915 kN/m
    const r = verticalResistance({ ...worked, method: 'simplified', buildingHeight_m: 15, floorSpan_m: 3.5 })
    expect(r.phi).toBeCloseTo(0.737233, 6)
    expect(r.NRd_kNm).toBeCloseTo(235.915, 3)
    expect(r.failedChecks).toEqual([])
  })

  it('simplified method: a long floor span lowers Φs to 1.3 − lf/8 (recalled, derived by hand)', () => {
    // 1.3 − 5/8 = 0.675 < 0.737233
    const r = verticalResistance({ ...worked, method: 'simplified', buildingHeight_m: 15, floorSpan_m: 5 })
    expect(r.phi).toBeCloseTo(0.675, 12)
  })

  it.each<[string, Partial<VerticalResistanceInput>, RegExp]>([
    // recalled: EN 1996-3 §4.2.1.1 limits; EN 1996-1-1 §5.5.1.4 slenderness 27
    ['building over 20 m', { buildingHeight_m: 24 }, /Building height 24 m exceeds 20 m/],
    ['storey over 3.2 m', { h_m: 3.5 }, /storey height 3.5 m exceeds 3.2 m/],
    ['slenderness over 21', { t_mm: 90 }, /Slenderness 22\.5 exceeds 21/],
    ['span over 7 m', { floorSpan_m: 7.5 }, /Floor span 7.5 m exceeds 7 m/],
    ['imposed load over 5 kN/m²', { imposedLoad_kNm2: 7.5 }, /Imposed load 7.5 kN\/m² exceeds 5/],
  ])('simplified method flags %s', (_n, change, message) => {
    const r = verticalResistance({ ...worked, method: 'simplified', buildingHeight_m: 15, floorSpan_m: 3.5, ...change })
    expect(r.failedChecks.some((c) => message.test(c))).toBe(true)
    expect(Number.isFinite(r.NRd_kNm)).toBe(true)
  })

  it('flags slenderness above 27 (recalled: EN 1996-1-1 §5.5.1.4)', () => {
    // hef/tef = 3000/100 = 30
    const r = verticalResistance({ ...worked, t_mm: 100, h_m: 3.0, rho: 1 })
    expect(r.slenderness).toBeCloseTo(30, 12)
    expect(r.failedChecks.some((c) => /exceeds 27/.test(c))).toBe(true)
  })

  it('an eccentricity beyond t/2 gives Φ = 0 and a failed check, never NaN', () => {
    const r = verticalResistance({ ...worked, topEccentricity_mm: 120 })
    expect(r.phiTop).toBe(0)
    expect(r.NRd_kNm).toBe(0)
    expect(r.failedChecks.length).toBeGreaterThan(0)
    for (const v of [r.phiTop, r.phiMid, r.phiBottom, r.NRd_kNm]) expect(Number.isNaN(v)).toBe(false)
  })

  it.each<[string, Partial<VerticalResistanceInput>, string]>([
    ['zero fk', { fk: 0 }, 'fk'],
    ['γM below 1', { gammaM: 0.8 }, 'gammaM'],
    ['negative thickness', { t_mm: -200 }, 't_mm'],
    ['NaN eccentricity', { topEccentricity_mm: Number.NaN }, 'topEccentricity_mm'],
    ['Annex G without a bottom eccentricity', { bottomEccentricity_mm: undefined }, 'bottomEccentricity_mm'],
    ['unknown method', { method: 'guess' as never }, 'method'],
    ['simplified without building height', { method: 'simplified', floorSpan_m: 4 }, 'buildingHeight_m'],
    ['simplified without span', { method: 'simplified', buildingHeight_m: 10 }, 'floorSpan_m'],
  ])('rejects %s', (_n, change, field) => {
    expectInputError(() => verticalResistance({ ...worked, ...change }), field)
  })

  it('schema requires the simplified method limits inputs', () => {
    expect(verticalResistanceInput.safeParse(worked).success).toBe(true)
    expect(verticalResistanceInput.safeParse({ ...worked, method: 'simplified' }).success).toBe(false)
    expect(verticalResistanceInput.safeParse({ fk: 4, gammaM: 2.5, t_mm: 200, h_m: 2.7, rho: 0.75, method: 'annex-g' }).success).toBe(false)
    const simplified = { fk: 4, gammaM: 2.5, t_mm: 200, h_m: 2.7, rho: 0.75, method: 'simplified', buildingHeight_m: 12, floorSpan_m: 4 }
    expect(verticalResistanceInput.safeParse(simplified).success).toBe(true)
    expect(Number.isFinite(verticalResistance(simplified as VerticalResistanceInput).NRd_kNm)).toBe(true)
  })
})
