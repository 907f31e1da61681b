import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../../shared/calc/errors'
import {
  TERRAIN_CATEGORIES,
  WALL_CPE_TABLE,
  WIND_ENGINEER_CAUTION,
  anchorLayout,
  anchorsPerM2,
  cpeForArea,
  peakVelocityPressure,
  wallPressureCoefficients,
  type TerrainCategory,
} from '../../../shared/calc/wind'
import { anchorLayoutInput, peakVelocityPressureInput } from '../../../shared/calc/schemas2'

describe('terrain categories', () => {
  // published: EN 1991-1-4 Table 4.1 (z0 and zmin in m)
  it.each<[TerrainCategory, number, number]>([
    ['0', 0.003, 1],
    ['I', 0.01, 1],
    ['II', 0.05, 2],
    ['III', 0.3, 5],
    ['IV', 1.0, 10],
  ])('category %s has z0 = %s m and zmin = %s m', (cat, z0, zmin) => {
    expect(TERRAIN_CATEGORIES[cat].z0).toBe(z0)
    expect(TERRAIN_CATEGORIES[cat].zmin).toBe(zmin)
    const r = peakVelocityPressure({ vb: 25, z: 30, terrain: cat })
    expect(r.z0).toBe(z0)
    expect(r.zmin).toBe(zmin)
    // published: EN 1991-1-4 Expression 4.5, kr = 0.19·(z0/z0,II)^0.07
    expect(r.kr).toBeCloseTo(0.19 * Math.pow(z0 / 0.05, 0.07), 12)
  })
})

describe('peak velocity pressure qp', () => {
  // Derived by hand from EN 1991-1-4 §4.3–4.5 (ρ = 1.25, kI = 1, co = 1):
  // II, vb 26, z 15: kr = 0.19; ln(15/0.05) = ln 300 = 5.70378; cr = 1.08372; vm = 28.1767 m/s;
  //   Iv = 1/5.70378 = 0.175322; qp = (1 + 7·0.175322)·0.625·28.1767² = 2.22725·496.21 = 1105.2 Pa.
  // III, vb 26, z 15: kr = 0.19·6^0.07 = 0.215389; ln(15/0.3) = ln 50 = 3.91202; cr = 0.842608;
  //   vm = 21.9078 m/s; Iv = 0.255622; qp = 2.78936·299.97 = 836.7 Pa.
  // IV, vb 26, z 5 (< zmin 10, so z = 10): kr = 0.19·20^0.07 = 0.234329; ln 10 = 2.302585; cr = 0.539562;
  //   vm = 14.0286 m/s; Iv = 0.434294; qp = 4.04006·123.00 = 496.9 Pa.
  it.each<[TerrainCategory, number, number, { cr: number; vm: number; Iv: number; qp: number }]>([
    ['II', 26, 15, { cr: 1.08372, vm: 28.1767, Iv: 0.175322, qp: 1105.2 }],
    ['III', 26, 15, { cr: 0.842608, vm: 21.9078, Iv: 0.255622, qp: 836.7 }],
    ['IV', 26, 5, { cr: 0.539562, vm: 14.0286, Iv: 0.434294, qp: 496.9 }],
  ])('terrain %s, vb %s m/s, z %s m (derived by hand)', (terrain, vb, z, want) => {
    const r = peakVelocityPressure({ vb, z, terrain })
    expect(r.cr).toBeCloseTo(want.cr, 4)
    expect(r.vm).toBeCloseTo(want.vm, 3)
    expect(r.Iv).toBeCloseTo(want.Iv, 5)
    expect(r.qp).toBeCloseTo(want.qp, 0)
    // derived by hand: qb = 0.625·26² = 422.5 Pa
    expect(r.qb).toBeCloseTo(422.5, 6)
    expect(r.caution).toBe(WIND_ENGINEER_CAUTION)
  })

  it('uses zmin below the minimum height, so qp is the same at 1 m and 2 m in category II', () => {
    // published: EN 1991-1-4 Expression 4.4, cr(z) = cr(zmin) for z ≤ zmin
    const low = peakVelocityPressure({ vb: 26, z: 1, terrain: 'II' })
    const atMin = peakVelocityPressure({ vb: 26, z: 2, terrain: 'II' })
    expect(low.zUsed).toBe(2)
    expect(low.qp).toBeCloseTo(atMin.qp, 9)
  })

  it('scales the mean velocity with the orography factor', () => {
    // derived by hand: vm = cr·co·vb, so co = 1.2 multiplies vm by 1.2
    const flat = peakVelocityPressure({ vb: 26, z: 15, terrain: 'II' })
    const hill = peakVelocityPressure({ vb: 26, z: 15, terrain: 'II', co: 1.2 })
    expect(hill.vm / flat.vm).toBeCloseTo(1.2, 9)
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['zero vb', { vb: 0, z: 10, terrain: 'II' }, 'vb'],
    ['negative z', { vb: 26, z: -1, terrain: 'II' }, 'z'],
    ['z above 200 m', { vb: 26, z: 250, terrain: 'II' }, 'z'],
    ['unknown terrain', { vb: 26, z: 10, terrain: 'V' }, 'terrain'],
    ['NaN vb', { vb: Number.NaN, z: 10, terrain: 'II' }, 'vb'],
    ['zero co', { vb: 26, z: 10, terrain: 'II', co: 0 }, 'co'],
  ])('rejects %s with CalcInputError naming the field', (_name, input, field) => {
    try {
      peakVelocityPressure(input as never)
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })

  it('schema rejects what the engine rejects and accepts a valid input', () => {
    expect(peakVelocityPressureInput.safeParse({ vb: 26, z: 15, terrain: 'II' }).success).toBe(true)
    expect(peakVelocityPressureInput.safeParse({ vb: 26, z: 15, terrain: 'V' }).success).toBe(false)
    expect(peakVelocityPressureInput.safeParse({ vb: -1, z: 15, terrain: 'II' }).success).toBe(false)
  })
})

describe('wall pressure coefficients', () => {
  // published: EN 1991-1-4 Table 7.1, cpe,10 and cpe,1 per zone at h/d = 5, 1, ≤ 0.25
  it.each<[number, string, number, number]>([
    [5, 'A', -1.2, -1.4],
    [5, 'B', -0.8, -1.1],
    [5, 'C', -0.5, -0.5],
    [5, 'D', 0.8, 1.0],
    [5, 'E', -0.7, -0.7],
    [1, 'A', -1.2, -1.4],
    [1, 'D', 0.8, 1.0],
    [1, 'E', -0.5, -0.5],
    [0.25, 'A', -1.2, -1.4],
    [0.25, 'B', -0.8, -1.1],
    [0.25, 'D', 0.7, 1.0],
    [0.25, 'E', -0.3, -0.3],
  ])('h/d %s zone %s: cpe,10 %s and cpe,1 %s', (hOverD, zone, cpe10, cpe1) => {
    const row = WALL_CPE_TABLE.find((r) => r.hOverD === hOverD)!
    expect(row.cpe10[zone as 'A']).toBe(cpe10)
    expect(row.cpe1[zone as 'A']).toBe(cpe1)
    // A building with exactly that h/d (b < d so that zone C exists) returns cpe,10 at 10 m² and cpe,1 at 1 m².
    const d = 10
    const big = wallPressureCoefficients({ b: 5, d, h: hOverD * d, loadedArea_m2: 10 }).zones.find((z) => z.zone === zone)!
    const small = wallPressureCoefficients({ b: 5, d, h: hOverD * d, loadedArea_m2: 1 }).zones.find((z) => z.zone === zone)!
    expect(big.cpe).toBeCloseTo(cpe10, 12)
    expect(small.cpe).toBeCloseTo(cpe1, 12)
  })

  it.each<[number, number, number, number]>([
    // value recalled from EN 1991-1-4 Figure 7.2: cpe = cpe,1 − (cpe,1 − cpe,10)·log10 A
    // derived by hand: zone A, A = 5 m²: −1.4 − (−1.4 + 1.2)·0.69897 = −1.26021
    [-1.4, -1.2, 5, -1.26021],
    // derived by hand: zone B, A = 2 m²: −1.1 + 0.3·0.30103 = −1.00969
    [-1.1, -0.8, 2, -1.00969],
    [-1.4, -1.2, 0.5, -1.4],
    [-1.4, -1.2, 25, -1.2],
  ])('cpe for cpe,1 %s, cpe,10 %s and A = %s m² is %s', (cpe1, cpe10, area, want) => {
    expect(cpeForArea(cpe1, cpe10, area)).toBeCloseTo(want, 5)
  })

  it('interpolates D and E linearly in h/d (derived by hand)', () => {
    // h/d = 0.625, midway between 0.25 and 1: D cpe,10 = (0.7 + 0.8)/2 = 0.75, E = (−0.3 − 0.5)/2 = −0.4
    const r = wallPressureCoefficients({ b: 30, d: 16, h: 10, loadedArea_m2: 10 })
    expect(r.hOverD).toBeCloseTo(0.625, 12)
    expect(r.zones.find((z) => z.zone === 'D')!.cpe).toBeCloseTo(0.75, 12)
    expect(r.zones.find((z) => z.zone === 'E')!.cpe).toBeCloseTo(-0.4, 12)
    // h/d = 3, midway between 1 and 5: E = (−0.5 − 0.7)/2 = −0.6
    const tall = wallPressureCoefficients({ b: 30, d: 10, h: 30, loadedArea_m2: 10 })
    expect(tall.zones.find((z) => z.zone === 'E')!.cpe).toBeCloseTo(-0.6, 12)
  })

  it.each<[string, { b: number; d: number; h: number }, string, Record<string, number>]>([
    // published: EN 1991-1-4 Figure 7.5; widths derived by hand
    // b 20, h 15 → e = min(20, 30) = 20 < d 30: A = 4, B = 16, C = 10
    ['e < d', { b: 20, d: 30, h: 15 }, 'e<d', { A: 4, B: 16, C: 10 }],
    // b 40, h 15 → e = 30 ≥ d 12 and < 60: A = 6, B = 12 − 6 = 6
    ['d ≤ e < 5d', { b: 40, d: 12, h: 15 }, 'd<=e<5d', { A: 6, B: 6 }],
    // b 40, h 15 → e = 30 ≥ 5·5: A over the whole depth 5
    ['e ≥ 5d', { b: 40, d: 5, h: 15 }, 'e>=5d', { A: 5 }],
  ])('zone widths for %s', (_name, dims, layout, widths) => {
    const r = wallPressureCoefficients({ ...dims, loadedArea_m2: 1 })
    expect(r.layout).toBe(layout)
    const side = r.zones.filter((z) => z.face === 'side')
    expect(Object.fromEntries(side.map((z) => [z.zone, z.width_m]))).toEqual(widths)
    // the side zones cover the whole depth d
    expect(side.reduce((s, z) => s + z.width_m, 0)).toBeCloseTo(dims.d, 12)
    expect(r.zones.find((z) => z.zone === 'D')!.width_m).toBe(dims.b)
  })

  it('splits the windward face into reference-height strips (published: EN 1991-1-4 Figure 7.4)', () => {
    expect(wallPressureCoefficients({ b: 20, d: 10, h: 15, loadedArea_m2: 1 }).referenceHeights_m).toEqual([15])
    expect(wallPressureCoefficients({ b: 10, d: 10, h: 15, loadedArea_m2: 1 }).referenceHeights_m).toEqual([10, 15])
    expect(wallPressureCoefficients({ b: 10, d: 10, h: 40, loadedArea_m2: 1 }).referenceHeights_m).toEqual([10, 20, 30, 40])
  })

  it.each<[string, Record<string, number>, string]>([
    ['zero b', { b: 0, d: 10, h: 10, loadedArea_m2: 1 }, 'b'],
    ['negative h', { b: 10, d: 10, h: -3, loadedArea_m2: 1 }, 'h'],
    ['zero area', { b: 10, d: 10, h: 10, loadedArea_m2: 0 }, 'loadedArea_m2'],
    ['infinite d', { b: 10, d: Number.POSITIVE_INFINITY, h: 10, loadedArea_m2: 1 }, 'd'],
  ])('rejects %s', (_n, input, field) => {
    expect(() => wallPressureCoefficients(input as never)).toThrow(CalcInputError)
    try {
      wallPressureCoefficients(input as never)
    } catch (e) {
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})

describe('anchors per m²', () => {
  // Worked case, derived by hand: qp = 1105.2 Pa (terrain II, vb 26, z 15, above); anchor NRd 0.20 kN; γQ 1.5.
  // Zone A, cpe,1 = −1.4: wEd = 1.5·1105.17·1.4 = 2320.9 Pa = 2.3209 kN/m²; n = 2.3209/0.20 = 11.60 → 12/m² (load).
  // Zone C, cpe = −0.5: wEd = 0.82888 kN/m²; n = 4.144 → 5, below the minimum 6 (common practice) → 6 (minimum).
  const qp = peakVelocityPressure({ vb: 26, z: 15, terrain: 'II' }).qp
  it.each<[string, number, number, number, number, 'load' | 'minimum']>([
    ['A', -1.4, 2.32086, 11.6043, 12, 'load'],
    ['B', -1.1, 1.82354, 9.1177, 10, 'load'],
    ['C', -0.5, 0.82888, 4.1444, 6, 'minimum'],
  ])('zone %s (cpe %s): wEd %s kN/m², n %s → %s (%s governs)', (_zone, cpe, wEd, n, perM2, governs) => {
    const r = anchorsPerM2({ qp, cpe, anchorResistance_kN: 0.2, minimumPerM2: 6 })
    expect(r.wEd_kNm2).toBeCloseTo(wEd, 4)
    expect(r.requiredUnrounded).toBeCloseTo(n, 3)
    expect(r.perM2).toBe(perM2)
    expect(r.governs).toBe(governs)
    expect(r.caution).toMatch(/chartered structural engineer/)
  })

  it('defaults to γQ 1.5 and a minimum of 6 per m² (common practice), and rounds to the next pattern', () => {
    const r = anchorsPerM2({ qp: 1000, cpe: -1.2, anchorResistance_kN: 0.25 })
    // derived by hand: wEd = 1.5·1000·1.2 = 1.8 kN/m²; n = 7.2 → 8
    expect(r.wEd_kNm2).toBeCloseTo(1.8, 12)
    expect(r.requiredRoundedUp).toBe(8)
    expect(r.minimumPerM2).toBe(6)
    const p = anchorsPerM2({ qp: 1000, cpe: -1.2, anchorResistance_kN: 0.25, patterns: [6, 10, 14] })
    expect(p.perM2).toBe(10)
    expect(p.exceedsPatterns).toBe(false)
    const over = anchorsPerM2({ qp: 3000, cpe: -1.4, anchorResistance_kN: 0.1, patterns: [6, 10, 14] })
    expect(over.exceedsPatterns).toBe(true)
  })

  it('does not add an anchor for float noise when n is a whole number', () => {
    // derived by hand: 1.5·800·1.0/1000 = 1.2 kN/m²; / 0.15 = 8 exactly
    expect(anchorsPerM2({ qp: 800, cpe: -1.0, anchorResistance_kN: 0.15 }).requiredRoundedUp).toBe(8)
  })

  it.each<[string, Record<string, unknown>, string]>([
    ['zero resistance', { qp: 1000, cpe: -1, anchorResistance_kN: 0 }, 'anchorResistance_kN'],
    ['negative qp', { qp: -5, cpe: -1, anchorResistance_kN: 0.2 }, 'qp'],
    ['NaN cpe', { qp: 1000, cpe: Number.NaN, anchorResistance_kN: 0.2 }, 'cpe'],
    ['γQ below 1', { qp: 1000, cpe: -1, anchorResistance_kN: 0.2, gammaQ: 0.5 }, 'gammaQ'],
  ])('rejects %s', (_n, input, field) => {
    try {
      anchorsPerM2(input as never)
      expect.unreachable('should have thrown')
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError)
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})

describe('anchor layout', () => {
  it('counts edge and field anchors for a facade (derived by hand)', () => {
    // qp 1105.17 Pa, NRd 0.20 kN: A 12/m², B 10/m², C 6/m² (from the worked case above).
    // Zone areas after openings: A 120 m² × 12 = 1440 edge anchors; B 240 m² × 10 = 2400; C 90 m² × 6 = 540.
    const qp = peakVelocityPressure({ vb: 26, z: 15, terrain: 'II' }).qp
    const r = anchorLayout({
      qp,
      anchorResistance_kN: 0.2,
      zones: [
        { zone: 'A', area_m2: 120, cpe: -1.4 },
        { zone: 'B', area_m2: 240, cpe: -1.1 },
        { zone: 'C', area_m2: 90, cpe: -0.5 },
      ],
    })
    expect(r.edgeCount).toBe(1440)
    expect(r.fieldCount).toBe(2400 + 540)
    expect(r.total).toBe(4380)
    expect(r.edgeArea_m2).toBe(120)
    expect(r.averagePerM2).toBeCloseTo(4380 / 450, 12)
    expect(r.zones.map((z) => z.edge)).toEqual([true, false, false])
    expect(r.caution).toBe(WIND_ENGINEER_CAUTION)
    expect(anchorLayoutInput.safeParse({ qp, anchorResistance_kN: 0.2, zones: [{ zone: 'A', area_m2: 1, cpe: -1.4 }] }).success).toBe(true)
  })

  it('rejects an empty zone list and a negative area', () => {
    expect(() => anchorLayout({ qp: 1000, anchorResistance_kN: 0.2, zones: [] })).toThrow(CalcInputError)
    expect(() => anchorLayout({ qp: 1000, anchorResistance_kN: 0.2, zones: [{ zone: 'A', area_m2: -1, cpe: -1 }] })).toThrow(/zones\[0\]\.area_m2/)
  })
})
