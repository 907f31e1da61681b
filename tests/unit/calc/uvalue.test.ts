import { describe, expect, it } from 'vitest'
import {
  CalcInputError,
  jointFraction,
  roundSignificant,
  thicknessForTargetU,
  uValue,
  type UValueInput,
} from '../../../shared/calc/index'

// published: Scottish Government, "Tables of U-values and thermal conductivity, 6.B Worked examples of U-value
// calculations using the combined method" (2020), example 6.B.3.
const govScot6B3: UValueInput = {
  layers: [
    { name: 'Brick outer leaf', thickness_mm: 102, lambda: 0.77 },
    { name: 'Cavity', resistance: 0.18 },
    { name: 'Aircrete block with mortar', thickness_mm: 125, lambda: 0.11, bridge: { lambda: 0.88, fraction: 0.067 } },
    { name: 'Mineral wool between studs', thickness_mm: 89, lambda: 0.038, bridge: { lambda: 0.13, fraction: 0.118 } },
    { name: 'Plasterboard', thickness_mm: 12.5, lambda: 0.21 },
  ],
  rsi: 0.13,
  rse: 0.04,
}

describe('uValue: published combined-method worked example', () => {
  const r = uValue(govScot6B3)
  // Published figures are rounded to three decimals from fractions rounded to 0.1 %; ±0.005 m²K/W covers that.
  it.each([
    ['upper limit R\'T', r.upperR, 3.617, 0.005], // published: gov.scot 6.B.3
    ['lower limit R\'\'T', r.lowerR, 3.136, 0.005], // published: gov.scot 6.B.3
  ])('%s', (_label, got, published, tol) => {
    expect(Math.abs(got - published)).toBeLessThanOrEqual(tol)
  })

  it('U rounds to the published 0.30 W/m²K', () => {
    expect(r.uRounded).toBe(0.3) // published: gov.scot 6.B.3
    expect(r.u).toBeGreaterThanOrEqual(0.295)
    expect(r.u).toBeLessThan(0.305)
  })

  it('builds the four parallel paths with product fractions that sum to 1', () => {
    expect(r.paths).toHaveLength(4)
    expect(r.paths.reduce((s, p) => s + p.fraction, 0)).toBeCloseTo(1, 12)
    // RT = (R'T + R''T)/2 and e = (R'T − R''T)/(2RT), value recalled from EN ISO 6946:2017 §6.7.2
    expect(r.totalR).toBeCloseTo((r.upperR + r.lowerR) / 2, 12)
    expect(r.relativeError).toBeCloseTo((r.upperR - r.lowerR) / (2 * r.totalR), 12)
  })

  it('carries its caution and standard', () => {
    expect(r.caution).toMatch(/not a compliance certificate/)
    expect(r.standard.join(' ')).toMatch(/EN ISO 6946:2017 §6\.7\.2/)
  })
})

describe('jointFraction', () => {
  it.each([
    // computed from the formula f = 1 − lh/((l+j)(h+j)) in domain notes §1 (EN 1996 joint thicknesses)
    [440, 215, 10, 0.066], // 1 − 94600/101250 = 0.0657
    [440, 215, 3, 0.02], // 1 − 94600/96574 = 0.0204
    [440, 215, 0, 0],
  ])('%i × %i mm with %i mm joints → %d', (l, h, j, expected) => {
    expect(jointFraction({ unitLength_mm: l, unitHeight_mm: h, joint_mm: j })).toBeCloseTo(expected, 3)
  })

  it('brick face 215 × 65 with 10 mm joints (computed by hand: 1 − 13975/16875 = 0.17185)', () => {
    expect(jointFraction({ unitLength_mm: 215, unitHeight_mm: 65, joint_mm: 10 })).toBeCloseTo(0.17185, 5)
  })

  it.each([
    ['unitLength_mm', { unitLength_mm: 0, unitHeight_mm: 215, joint_mm: 3 }],
    ['unitHeight_mm', { unitLength_mm: 440, unitHeight_mm: -1, joint_mm: 3 }],
    ['joint_mm', { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: -3 }],
    ['joint_mm', { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: Number.NaN }],
  ])('rejects a bad %s', (field, input) => {
    expect(() => jointFraction(input)).toThrow(CalcInputError)
    try {
      jointFraction(input)
    }
    catch (e) {
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})

// A simple unbridged ETICS wall, derived by hand with Rsi 0.13 and Rse 0.04 (value recalled from EN ISO 6946:2017
// Table 7): block 0.215/0.29 = 0.741379, EPS 0.150/0.036 = 4.166667, so RT,h = 0.17 + 4.908046 = 5.078046.
const etics = (extra: Partial<UValueInput> = {}): UValueInput => ({
  layers: [
    { name: 'Block', thickness_mm: 215, lambda: 0.29 },
    { name: 'EPS', thickness_mm: 150, lambda: 0.036 },
  ],
  ...extra,
})

describe('uValue: Annex F corrections (value recalled from EN ISO 6946:2017 Annex F)', () => {
  it('unbridged: U = 1/RT exactly and both limits equal', () => {
    const r = uValue(etics())
    expect(r.upperR).toBeCloseTo(5.078046, 5)
    expect(r.lowerR).toBeCloseTo(r.upperR, 12)
    expect(r.u).toBeCloseTo(1 / 5.078046, 6)
    expect(r.deltaUf).toBe(0)
    expect(r.deltaUg).toBe(0)
  })

  it.each([
    // Full penetration, α = 0.8: 0.8·50·(π·0.0025²)·6/0.150·(4.166667/5.078046)² = 0.0211513
    ['steel pin through the full layer', { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50 }, 0.0211513],
    // Recessed 20 mm, α = 0.8·130/150, R1 = 0.130/0.036 = 3.611111:
    // 0.693333·50·1.963495e-5·6/0.130·(3.611111/5.078046)² = 0.0158869
    ['steel pin recessed 20 mm', { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50, penetration_mm: 130 }, 0.0158869],
    // λ below 1 W/mK: no correction
    ['polyamide fixing', { layerIndex: 1, perM2: 6, diameter_mm: 8, lambda: 0.25 }, 0],
  ])('ΔUf for a %s', (_label, fixing, expected) => {
    const r = uValue(etics({ fixings: fixing }))
    expect(r.deltaUf).toBeCloseTo(expected, 6)
    expect(r.u).toBeCloseTo(r.uUncorrected + expected, 6)
  })

  it('adds the ΔUf of several fixing kinds', () => {
    const one = uValue(etics({ fixings: { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50 } })).deltaUf
    const two = uValue(etics({ fixings: [{ layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50 }, { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50 }] })).deltaUf
    expect(two).toBeCloseTo(2 * one, 12)
  })

  it.each([
    // ΔUg = ΔU''·(R1/RT)², (4.166667/5.078046)² = 0.673263
    [0, 0],
    [1, 0.01 * 0.673263],
    [2, 0.04 * 0.673263],
  ] as const)('ΔUg at air-gap level %i', (level, expected) => {
    const r = uValue(etics({ airGapLevel: level }))
    expect(r.deltaUg).toBeCloseTo(expected, 6)
  })

  it('keeps the corrections in U even where the 3 % rule would allow omitting them', () => {
    // 6 stainless pins of 2 mm: 0.8·17·π·0.001²·6/0.15·0.673263 = 0.00115, under 3 % of U ≈ 0.197
    const r = uValue(etics({ fixings: { layerIndex: 1, perM2: 6, diameter_mm: 2, lambda: 17 } }))
    expect(r.correctionsBelowThreshold).toBe(true)
    expect(r.deltaUf).toBeGreaterThan(0)
    expect(r.u).toBeCloseTo(r.uUncorrected + r.deltaUf, 12)
    expect(r.notes.join(' ')).toMatch(/3 %/)
  })

  it('adds declared point transmittances of anchors (common practice: ΔU = n·χ)', () => {
    const r = uValue(etics({ pointBridges: [{ perM2: 6, chi: 0.002 }] }))
    expect(r.deltaUchi).toBeCloseTo(0.012, 12)
    expect(r.u).toBeCloseTo(r.uUncorrected + 0.012, 12)
  })

  it('warns when insulation is bridged by metal', () => {
    const r = uValue({ layers: [{ thickness_mm: 100, lambda: 0.035, bridge: { lambda: 50, fraction: 0.01 } }] })
    expect(r.notes.join(' ')).toMatch(/metal/)
    expect(r.notes.join(' ')).toMatch(/1\.5 times/)
  })
})

describe('roundSignificant (two significant figures, recalled from EN ISO 6946:2017 §10)', () => {
  it.each([
    [0.2961, 0.3],
    [0.184, 0.18],
    [0.0956, 0.096],
    [1.234, 1.2],
    [0.155, 0.16],
  ])('%d → %d', (v, expected) => {
    expect(roundSignificant(v, 2)).toBe(expected)
  })
})

describe('uValue: invalid input is a clear error, never NaN', () => {
  const bad: [string, string, unknown][] = [
    ['zero thickness', 'layers[0].thickness_mm', { layers: [{ thickness_mm: 0, lambda: 0.5 }] }],
    ['negative thickness', 'layers[0].thickness_mm', { layers: [{ thickness_mm: -10, lambda: 0.5 }] }],
    ['λ of zero', 'layers[0].lambda', { layers: [{ thickness_mm: 100, lambda: 0 }] }],
    ['negative λ', 'layers[0].lambda', { layers: [{ thickness_mm: 100, lambda: -0.04 }] }],
    ['λ not a number', 'layers[0].lambda', { layers: [{ thickness_mm: 100, lambda: Number.NaN }] }],
    ['infinite thickness', 'layers[0].thickness_mm', { layers: [{ thickness_mm: Number.POSITIVE_INFINITY, lambda: 0.5 }] }],
    ['bridge fraction 0', 'layers[0].bridge.fraction', { layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0.9, fraction: 0 } }] }],
    ['bridge fraction 1', 'layers[0].bridge.fraction', { layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0.9, fraction: 1 } }] }],
    ['bridge fraction above 1 (fractions would not sum to 1)', 'layers[0].bridge.fraction', { layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0.9, fraction: 1.2 } }] }],
    ['negative bridge fraction', 'layers[0].bridge.fraction', { layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0.9, fraction: -0.1 } }] }],
    ['bridge λ of zero', 'layers[0].bridge.lambda', { layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0, fraction: 0.1 } }] }],
    ['no layers', 'layers', { layers: [] }],
    ['negative resistance', 'layers[0].resistance', { layers: [{ resistance: -0.18 }] }],
    ['Rsi above 1', 'rsi', { layers: [{ resistance: 1 }], rsi: 3 }],
    ['air-gap level 3', 'airGapLevel', { layers: [{ resistance: 1 }], airGapLevel: 3 }],
    ['fixing in a layer that does not exist', 'fixings[0].layerIndex', etics({ fixings: { layerIndex: 5, perM2: 6, diameter_mm: 5, lambda: 50 } })],
    ['fixing deeper than its layer', 'fixings[0].penetration_mm', etics({ fixings: { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: 50, penetration_mm: 200 } })],
    ['fixing in a declared resistance', 'fixings[0].layerIndex', { layers: [{ resistance: 2 }], fixings: { layerIndex: 0, perM2: 6, diameter_mm: 5, lambda: 50 } }],
  ]
  it.each(bad)('%s', (_label, field, input) => {
    let error: unknown
    try {
      uValue(input as UValueInput)
    }
    catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(CalcInputError)
    expect((error as CalcInputError).field).toBe(field)
    expect((error as CalcInputError).message.length).toBeGreaterThan(10)
  })
})

describe('thicknessForTargetU', () => {
  // Demo-style wall, unbridged so that it can be checked by hand (Rsi 0.13, Rse 0.04 recalled from EN ISO 6946):
  // plaster 0.013/0.57 = 0.022807, block 0.215/0.29 = 0.741379; others 0.934186. U 0.15 needs RT ≥ 6.666667,
  // so R_EPS ≥ 5.732481 and d ≥ 5.732481·0.031 = 0.17771 m: the next 10 mm step is 180 mm.
  const wall: UValueInput = {
    layers: [
      { name: 'Plaster', thickness_mm: 13, lambda: 0.57 },
      { name: 'Block', thickness_mm: 215, lambda: 0.29 },
      { name: 'Graphite EPS', thickness_mm: 100, lambda: 0.031 },
    ],
  }

  it.each([
    [0.15, 10, 180],
    [0.15, 5, 180], // 177.7 mm → next 5 mm step is 180
    [0.15, 1, 178],
    [0.18, 10, 150], // RT ≥ 5.555556 → d ≥ 0.14326 m
  ])('U ≤ %d in %i mm steps → %i mm (derived by hand)', (targetU, step, expected) => {
    const r = thicknessForTargetU({ ...wall, layerIndex: 2, targetU, step_mm: step })
    expect(r.thickness_mm).toBe(expected)
    expect(r.u).toBeLessThanOrEqual(targetU)
    expect(r.caution).toMatch(/competent designer/)
  })

  it('returns the least step: one step thinner misses the target (demo wall with joints and a recessed fixing)', () => {
    const f = jointFraction({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3 })
    const build = (eps_mm: number): UValueInput => ({
      layers: [
        { thickness_mm: 13, lambda: 0.57 },
        { thickness_mm: 215, lambda: 0.29, bridge: { lambda: 0.83, fraction: f } },
        { thickness_mm: eps_mm, lambda: 0.031 },
        { thickness_mm: 6, lambda: 0.8 },
      ],
      // recessed 20 mm: the sizing keeps the recess as the board grows
      fixings: { layerIndex: 2, perM2: 6, diameter_mm: 4, lambda: 50, penetration_mm: eps_mm - 20 },
    })
    const r = thicknessForTargetU({ ...build(150), layerIndex: 2, targetU: 0.15 })
    expect(r.u).toBeCloseTo(uValue(build(r.thickness_mm)).u, 12)
    expect(r.u).toBeLessThanOrEqual(0.15)
    expect(uValue(build(r.thickness_mm - 10)).u).toBeGreaterThan(0.15)
  })

  it.each([
    ['an unreachable target', 'targetU', { ...wall, layerIndex: 2, targetU: 0.05 }],
    ['sizing a declared resistance', 'layerIndex', { layers: [{ resistance: 0.2 }, { thickness_mm: 100, lambda: 0.03 }], layerIndex: 0, targetU: 0.2 }],
    ['a layer index past the end', 'layerIndex', { ...wall, layerIndex: 3, targetU: 0.2 }],
    ['a zero target', 'targetU', { ...wall, layerIndex: 2, targetU: 0 }],
  ])('rejects %s', (_label, field, input) => {
    expect(() => thicknessForTargetU(input as never)).toThrow(CalcInputError)
    try {
      thicknessForTargetU(input as never)
    }
    catch (e) {
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})
