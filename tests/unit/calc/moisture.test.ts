import { describe, expect, it } from 'vitest'
import {
  CalcInputError,
  DELTA0,
  condensationAt,
  condensationYear,
  dewPoint,
  internalVapourPressure,
  saturationPressure,
  type ClimatePoint,
  type CondensationAtInput,
  type VapourLayer,
} from '../../../shared/calc/index'

function fieldOf(fn: () => unknown): string | undefined {
  try {
    fn()
  }
  catch (e) {
    if (e instanceof CalcInputError) return e.field
    throw e
  }
  return undefined
}

describe('saturationPressure (formula recalled from EN ISO 13788:2012 Annex E)', () => {
  it.each([
    // [θ °C, Pa, tolerance Pa, source]
    [20, 2337, 1, 'value recalled from EN ISO 13788:2012 (20 °C → 2337 Pa)'],
    [0, 610.5, 0.01, 'value recalled from EN ISO 13788:2012 (0 °C → 610.5 Pa)'],
    [10, 1228, 2, 'common practice: psychrometric tables over water, 1228 Pa'],
    [30, 4246, 10, 'common practice: psychrometric tables over water, 4246 Pa'],
    [-10, 260, 1.5, 'common practice: psychrometric tables over ice, 259.9 Pa'],
    [-20, 103.3, 1, 'common practice: psychrometric tables over ice, 103.3 Pa'],
  ])('%d °C → %d Pa (±%d; %s)', (t, pa, tol) => {
    expect(Math.abs(saturationPressure(t) - pa)).toBeLessThanOrEqual(tol)
  })

  it('switches from ice to water at 0 °C without a jump', () => {
    expect(saturationPressure(-1e-9)).toBeCloseTo(saturationPressure(0), 4)
  })

  it.each([Number.NaN, Number.POSITIVE_INFINITY, -100, 120])('rejects %d', (t) => {
    expect(fieldOf(() => saturationPressure(t))).toBe('tempC')
  })
})

describe('dewPoint (inverse of the recalled EN ISO 13788 formula)', () => {
  it.each([
    // 20 °C 50 %: p = 1168.48, x = ln(1168.48/610.5) = 0.64921, θd = 237.3·x/(17.269 − x) = 9.27 °C
    [20, 50, 9.27, 'derived by hand; common practice quotes 9.3 °C'],
    // 20 °C 60 %: p = 1402.17, x = 0.83152, θd = 197.32/16.4375 = 12.00 °C
    [20, 60, 12.0, 'derived by hand; common practice quotes 12.0 °C'],
    [20, 100, 20, 'saturated air: the dew point is the air temperature'],
    // 0 °C 80 % over ice: x = ln 0.8 = −0.22314, θd = 265.5·x/(21.875 + 0.22314) = −2.68 °C
    [0, 80, -2.68, 'derived by hand (frost point)'],
    // −5 °C 90 %: psat = 401.2 Pa, p = 361.1 Pa, x = −0.52514, θd = −139.43/22.400 = −6.22 °C
    [-5, 90, -6.22, 'derived by hand (frost point)'],
  ])('%d °C at %d %% → %d °C (%s)', (t, rh, expected) => {
    expect(dewPoint(t, rh)).toBeCloseTo(expected, 1)
  })

  it.each([
    ['rhPercent', 20, 0],
    ['rhPercent', 20, -5],
    ['rhPercent', 20, 100.5],
    ['rhPercent', 20, Number.NaN],
    ['tempC', Number.NaN, 50],
  ])('rejects a bad %s (%d °C, %d %%)', (field, t, rh) => {
    expect(fieldOf(() => dewPoint(t, rh))).toBe(field)
  })
})

// Two-layer case derived by hand (δ0 = 2×10⁻¹⁰ kg/(m·s·Pa), Rsi 0.13, Rse 0.04 recalled from EN ISO 13788 / 6946):
//   layer 1: 100 mm insulation, λ 0.04, μ 1    → R 2.50, sd 0.1 m
//   layer 2:  10 mm sheet,      λ 1.0,  μ 1000 → R 0.01, sd 10 m
//   RT = 0.13 + 2.50 + 0.01 + 0.04 = 2.68 m²K/W
//   inside 20 °C 50 %: pi = 0.5·2336.95 = 1168.48 Pa; outside 0 °C 80 %: pe = 0.8·610.5 = 488.40 Pa
//   interface 1: θ = 20 − 20·2.63/2.68 = 0.3731 °C → psat = 610.5·exp(17.269·0.3731/237.6731) = 627.28 Pa
//   straight line there: 1168.48 − 680.08·0.1/10.1 = 1161.75 Pa > 627.28 Pa → condensation at interface 1
//   gc = δ0·[(1168.48 − 627.28)/0.1 − (627.28 − 488.40)/10] = 2e-10·(5412.0 − 13.89) = 1.0796e-6 kg/(m²·s)
const twoLayer: CondensationAtInput = {
  layers: [
    { name: 'Insulation', thickness_mm: 100, lambda: 0.04, mu: 1 },
    { name: 'Vapour-tight sheet', thickness_mm: 10, lambda: 1, mu: 1000 },
  ],
  inside: { tempC: 20, rhPercent: 50 },
  outside: { tempC: 0, rhPercent: 80 },
}

describe('condensationAt: Glaser steady state (EN ISO 13788:2012 §6)', () => {
  const r = condensationAt(twoLayer)

  it.each([
    ['inside surface temperature', r.interfaces[0]!.tempC, 20 - 20 * 0.13 / 2.68, 1e-9],
    ['interface temperature', r.interfaces[1]!.tempC, 0.3731, 1e-4],
    ['interface psat', r.interfaces[1]!.psat, 627.28, 0.01],
    ['vapour pressure at the plane (saturated)', r.interfaces[1]!.p, 627.28, 0.01],
    ['vapour pressure at the outside surface', r.interfaces[2]!.p, 488.4, 1e-6],
    ['vapour pressure at the inside surface', r.interfaces[0]!.p, 1168.48, 0.01],
  ])('%s (derived by hand)', (_label, got, expected, tol) => {
    expect(Math.abs(got - expected)).toBeLessThanOrEqual(tol)
  })

  it('finds the plane at interface 1 with the hand-derived rate', () => {
    expect(r.planes).toEqual([1])
    expect(r.rate).toBeGreaterThan(1.0796e-6 * 0.999)
    expect(r.rate).toBeLessThan(1.0796e-6 * 1.001)
    expect(r.fluxIn - r.fluxOut).toBeCloseTo(r.rate, 15)
    expect(r.caution).toMatch(/Glaser/)
    expect(r.standard.join(' ')).toMatch(/EN ISO 13788/)
  })

  it('reports no condensation with the tight layer on the warm side', () => {
    const swapped = condensationAt({ ...twoLayer, layers: [twoLayer.layers[1]!, twoLayer.layers[0]!] })
    expect(swapped.planes).toEqual([])
    expect(swapped.rate).toBe(0)
    // With no plane the line is straight: flux δ0·(pi − pe)/Σsd
    expect(swapped.fluxIn).toBeCloseTo(DELTA0 * (1168.4756 - 488.4) / 10.1, 12)
    for (const i of swapped.interfaces) expect(i.p).toBeLessThanOrEqual(i.psat)
  })

  it('finds two planes at once and shares the rate between them', () => {
    // Two insulation layers each closed on the cold side by a tighter layer: the straight tangent from pi to
    // the coldest point would cut below psat at interface 2, so the line must touch psat twice.
    const layers: VapourLayer[] = [
      { thickness_mm: 12.5, lambda: 0.21, mu: 10 },
      { thickness_mm: 50, lambda: 0.036, mu: 1 },
      { resistance: 0.01, sd: 3 },
      { thickness_mm: 50, lambda: 0.036, mu: 1 },
      { resistance: 0.01, sd: 10 },
    ]
    const two = condensationAt({ layers, inside: { tempC: 20, rhPercent: 60 }, outside: { tempC: -5, rhPercent: 90 } })
    expect(two.planes).toEqual([2, 4])
    const it_ = two.interfaces
    const flux = (a: number, b: number) => DELTA0 * (it_[a]!.p - it_[b]!.p) / (it_[b]!.sd - it_[a]!.sd)
    expect(two.planeRates[0]!.rate).toBeCloseTo(flux(0, 2) - flux(2, 4), 15)
    expect(two.planeRates[1]!.rate).toBeCloseTo(flux(2, 4) - flux(4, 5), 15)
    expect(two.rate).toBeCloseTo(two.planeRates[0]!.rate + two.planeRates[1]!.rate, 18)
    for (const i of two.interfaces) expect(i.p).toBeLessThanOrEqual(i.psat + 1e-9)
    expect(it_[2]!.p).toBeCloseTo(it_[2]!.psat, 9)
    expect(it_[4]!.p).toBeCloseTo(it_[4]!.psat, 9)
    // A single tangent from pi straight to interface 4 would exceed psat at interface 2:
    const single = it_[0]!.p + (it_[4]!.p - it_[0]!.p) * it_[2]!.sd / it_[4]!.sd
    expect(single).toBeGreaterThan(it_[2]!.psat)
  })

  it('flags inside surface condensation instead of returning an impossible line', () => {
    const r2 = condensationAt({ layers: [{ thickness_mm: 5, lambda: 1, mu: 1 }], inside: { tempC: 20, rhPercent: 95 }, outside: { tempC: -10, rhPercent: 80 } })
    expect(r2.surfaceCondensation.inside).toBe(true)
    expect(r2.interfaces[0]!.p).toBeCloseTo(r2.interfaces[0]!.psat, 9)
    expect(Number.isFinite(r2.rate)).toBe(true)
  })

  it.each([
    ['inside.rhPercent', { ...twoLayer, inside: { tempC: 20, rhPercent: 101 } }],
    ['outside.rhPercent', { ...twoLayer, outside: { tempC: 0, rhPercent: -1 } }],
    ['layers[0].thickness_mm', { ...twoLayer, layers: [{ thickness_mm: 0, lambda: 0.04, mu: 1 }] }],
    ['layers[0].lambda', { ...twoLayer, layers: [{ thickness_mm: 10, lambda: -1, mu: 1 }] }],
    ['layers[0].mu', { ...twoLayer, layers: [{ thickness_mm: 10, lambda: 1, mu: 0 }] }],
    ['layers[0].sd', { ...twoLayer, layers: [{ resistance: 0.18, sd: 0 }] }],
    ['layers', { ...twoLayer, layers: [] }],
    ['inside.tempC', { ...twoLayer, inside: { tempC: Number.NaN, rhPercent: 50 } }],
  ])('rejects a bad %s', (field, input) => {
    expect(fieldOf(() => condensationAt(input as CondensationAtInput))).toBe(field)
  })
})

// An illustrative mild maritime climate (invented for the test; not a design climate dataset), January first.
const maritime: ClimatePoint[] = [
  [5.3, 86], [5.4, 84], [6.8, 81], [8.3, 77], [10.9, 76], [13.6, 77],
  [15.4, 79], [15.1, 80], [13.3, 82], [10.6, 85], [7.4, 87], [6.0, 87],
].map(([tempC, rhPercent]) => ({ tempC: tempC!, rhPercent: rhPercent! }))

// Plaster, lightweight block, mineral wool, then an outer finish whose sd is varied: vapour reaches the cold side
// of the wool freely and is held there by the finish.
const wall = (finishSd: number): VapourLayer[] => [
  { name: 'Gypsum plaster', thickness_mm: 13, lambda: 0.57, mu: 10 },
  { name: 'Lightweight block', thickness_mm: 215, lambda: 0.4, mu: 5 },
  { name: 'Mineral wool', thickness_mm: 100, lambda: 0.036, mu: 1 },
  { name: 'Finish', resistance: 0.01, sd: finishSd },
]

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]

describe('condensationYear: monthly method (EN ISO 13788:2012 §6)', () => {
  const dries = condensationYear({ layers: wall(1), climate: maritime, internal: { tempC: 20, humidityClass: 3 } })
  const stays = condensationYear({ layers: wall(2), climate: maritime, internal: { tempC: 20, humidityClass: 3 } })

  it('a finish of sd 1 m: winter condensate evaporates within the year', () => {
    expect(dries.anyCondensation).toBe(true)
    expect(dries.startMonth).toBe(11) // first month with condensation after October's none
    expect(dries.maxAccumulation_kg_m2).toBeGreaterThan(0)
    expect(dries.driesOut).toBe(true)
    expect(dries.finalAccumulation_kg_m2).toBe(0)
    expect(dries.dryMonth).not.toBeNull()
    expect(dries.months.find(m => m.month === dries.dryMonth)!.state).toBe('evaporation')
  })

  it('a finish of sd 2 m: condensate is left after twelve months, so it fails', () => {
    expect(stays.driesOut).toBe(false)
    expect(stays.finalAccumulation_kg_m2).toBeGreaterThan(0)
    expect(stays.dryMonth).toBeNull()
    expect(stays.notes.join(' ')).toMatch(/year on year/)
    expect(stays.maxAccumulation_kg_m2).toBeGreaterThan(dries.maxAccumulation_kg_m2)
  })

  it.each([['dries', dries], ['stays', stays]] as const)('%s: the months add up to the final amount and the maximum', (_label, r) => {
    const total = r.months.reduce((s, m) => s + m.amount_kg_m2, 0)
    expect(total).toBeCloseTo(r.finalAccumulation_kg_m2, 12)
    expect(r.maxAccumulation_kg_m2).toBe(Math.max(...r.months.map(m => m.accumulated_kg_m2)))
    for (const m of r.months) expect(m.accumulated_kg_m2).toBeGreaterThanOrEqual(0)
  })

  it('the first month of condensation equals the steady-state rate times the month (consistency check)', () => {
    const m = dries.startMonth! - 1
    const c = maritime[m]!
    const pi = internalVapourPressure({ tempC: 20, humidityClass: 3 }, c)
    const steady = condensationAt({
      layers: wall(1),
      inside: { tempC: 20, rhPercent: 100 * pi / saturationPressure(20) },
      outside: c,
    })
    expect(steady.planes).toEqual([3])
    expect(dries.months[m]!.amount_kg_m2).toBeCloseTo(steady.rate * DAYS[m]! * 86400, 12)
  })

  it('humidity class 3 (values recalled from EN ISO 13788:2012, verify): pi = pe + 1.10·810·(20 − θe)/20', () => {
    const c = { tempC: 5, rhPercent: 80 }
    const pe = 0.8 * saturationPressure(5)
    expect(internalVapourPressure({ tempC: 20, humidityClass: 3 }, c)).toBeCloseTo(pe + 1.1 * 810 * 0.75, 9)
    expect(internalVapourPressure({ tempC: 20, humidityClass: 5 }, { tempC: -3, rhPercent: 90 }))
      .toBeCloseTo(0.9 * saturationPressure(-3) + 1.1 * 1350, 9)
    expect(internalVapourPressure({ tempC: 20, humidityClass: 1 }, { tempC: 22, rhPercent: 60 }))
      .toBeCloseTo(0.6 * saturationPressure(22), 9)
  })

  it('a vapour-open wall in a mild climate has no condensation at all', () => {
    const r = condensationYear({ layers: wall(0.1), climate: maritime, internal: { tempC: 20, rhPercent: 50 } })
    expect(r.anyCondensation).toBe(false)
    expect(r.startMonth).toBeNull()
    expect(r.driesOut).toBe(true)
    expect(r.months.every(m => m.state === 'dry')).toBe(true)
    expect(r.assumptions.join(' ')).toMatch(/50 %/)
  })

  it.each([
    ['climate', { layers: wall(1), climate: maritime.slice(0, 11), internal: { tempC: 20, rhPercent: 50 } }],
    ['climate[3].rhPercent', { layers: wall(1), climate: maritime.map((c, i) => (i === 3 ? { ...c, rhPercent: 140 } : c)), internal: { tempC: 20, rhPercent: 50 } }],
    ['internal.rhPercent', { layers: wall(1), climate: maritime, internal: { tempC: 20, rhPercent: -2 } }],
    ['internal.humidityClass', { layers: wall(1), climate: maritime, internal: { tempC: 20, humidityClass: 6 } }],
  ])('rejects a bad %s', (field, input) => {
    expect(fieldOf(() => condensationYear(input as never))).toBe(field)
  })
})
