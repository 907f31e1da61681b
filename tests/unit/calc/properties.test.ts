import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  condensationAt,
  condensationYear,
  dewPoint,
  jointFraction,
  saturationPressure,
  uValue,
  type UValueLayer,
  type VapourLayer,
} from '../../../shared/calc/index'

// Property tests (common practice: invariants of EN ISO 6946 and EN ISO 13788 that hold for any valid input).

function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value)
  if (Array.isArray(value)) return value.every(allFinite)
  if (value !== null && typeof value === 'object') return Object.values(value).every(allFinite)
  return true
}

const thickness = fc.double({ min: 1, max: 400, noNaN: true })
const lambda = fc.double({ min: 0.015, max: 3, noNaN: true })

const plainLayer = fc.record({ thickness_mm: thickness, lambda })
const bridgedLayer = fc.record({
  thickness_mm: thickness,
  lambda,
  bridge: fc.record({ lambda: fc.double({ min: 0.015, max: 3, noNaN: true }), fraction: fc.double({ min: 0.001, max: 0.6, noNaN: true }) }),
})
const resistanceLayer = fc.record({ resistance: fc.double({ min: 0.01, max: 2, noNaN: true }) })
const anyLayer: fc.Arbitrary<UValueLayer> = fc.oneof(plainLayer, bridgedLayer, resistanceLayer)

describe('uValue properties', () => {
  it('more thickness of any layer never raises U', () => {
    fc.assert(fc.property(
      fc.array(anyLayer, { minLength: 1, maxLength: 6 }),
      fc.nat(),
      fc.double({ min: 0, max: 300, noNaN: true }),
      (layers, pick, extra) => {
        const sized = layers.map((l, i) => ({ l, i })).filter(x => 'thickness_mm' in x.l)
        fc.pre(sized.length > 0)
        const { i } = sized[pick % sized.length]!
        const thicker = layers.map((l, k) => (k === i && 'thickness_mm' in l ? { ...l, thickness_mm: l.thickness_mm + extra } : l))
        const a = uValue({ layers })
        const b = uValue({ layers: thicker })
        expect(b.u).toBeLessThanOrEqual(a.u * (1 + 1e-12))
        expect(allFinite(a) && allFinite(b)).toBe(true)
      },
    ), { numRuns: 300 })
  })

  it('adding an insulation layer never raises U', () => {
    fc.assert(fc.property(
      fc.array(anyLayer, { minLength: 1, maxLength: 5 }),
      fc.double({ min: 20, max: 300, noNaN: true }),
      fc.double({ min: 0.02, max: 0.05, noNaN: true }),
      (layers, d, lam) => {
        const base = uValue({ layers })
        const withInsulation = uValue({ layers: [...layers, { thickness_mm: d, lambda: lam }] })
        expect(withInsulation.u).toBeLessThanOrEqual(base.u * (1 + 1e-12))
      },
    ), { numRuns: 200 })
  })

  it('unbridged layers: U = 1/ΣR and the two limits coincide', () => {
    fc.assert(fc.property(
      fc.array(fc.oneof(plainLayer, resistanceLayer), { minLength: 1, maxLength: 8 }),
      fc.double({ min: 0, max: 0.25, noNaN: true }),
      fc.double({ min: 0, max: 0.25, noNaN: true }),
      (layers, rsi, rse) => {
        const sum = rsi + rse + layers.reduce((s, l) => s + ('resistance' in l ? l.resistance : l.thickness_mm / 1000 / l.lambda), 0)
        const r = uValue({ layers, rsi, rse })
        expect(r.u).toBeCloseTo(1 / sum, 10)
        expect(Math.abs(r.u * sum - 1)).toBeLessThan(1e-12)
        expect(Math.abs(r.upperR - r.lowerR)).toBeLessThanOrEqual(1e-12 * r.upperR)
      },
    ), { numRuns: 300 })
  })

  it('upper limit ≥ lower limit, and the error is in [0, 1)', () => {
    fc.assert(fc.property(fc.array(anyLayer, { minLength: 1, maxLength: 6 }), (layers) => {
      const r = uValue({ layers })
      expect(r.upperR).toBeGreaterThanOrEqual(r.lowerR * (1 - 1e-12))
      expect(r.relativeError).toBeGreaterThanOrEqual(-1e-12)
      expect(r.relativeError).toBeLessThan(1)
    }), { numRuns: 300 })
  })

  it('corrections are never negative', () => {
    fc.assert(fc.property(
      plainLayer, plainLayer, fc.constantFrom(0, 1, 2) as fc.Arbitrary<0 | 1 | 2>,
      fc.double({ min: 0.1, max: 1, noNaN: true }),
      fc.double({ min: 1, max: 60, noNaN: true }),
      (a, b, level, depth, lam) => {
        const r = uValue({ layers: [a, b], airGapLevel: level, fixings: { layerIndex: 1, perM2: 6, diameter_mm: 5, lambda: lam, penetration_mm: b.thickness_mm * depth } })
        expect(r.deltaUg).toBeGreaterThanOrEqual(0)
        expect(r.deltaUf).toBeGreaterThanOrEqual(0)
        expect(r.u).toBeGreaterThanOrEqual(r.uUncorrected)
        expect(allFinite(r)).toBe(true)
      },
    ), { numRuns: 200 })
  })
})

describe('moisture properties', () => {
  it('dewPoint inverts saturationPressure', () => {
    fc.assert(fc.property(
      fc.double({ min: -30, max: 40, noNaN: true }),
      fc.double({ min: 5, max: 100, noNaN: true }),
      (t, rh) => {
        const td = dewPoint(t, rh)
        expect(td).toBeLessThanOrEqual(t + 1e-9)
        expect(saturationPressure(td) / (rh / 100 * saturationPressure(t))).toBeCloseTo(1, 9)
      },
    ))
  })

  it('saturation pressure rises with temperature', () => {
    fc.assert(fc.property(fc.double({ min: -50, max: 70, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), (t, dt) => {
      expect(saturationPressure(t + dt)).toBeGreaterThan(saturationPressure(t))
    }))
  })

  const vapourLayer: fc.Arbitrary<VapourLayer> = fc.oneof(
    fc.record({ thickness_mm: thickness, lambda, mu: fc.double({ min: 1, max: 5000, noNaN: true }) }),
    fc.record({ resistance: fc.double({ min: 0.01, max: 2, noNaN: true }), sd: fc.double({ min: 0.01, max: 100, noNaN: true }) }),
  )
  const climate = fc.record({ tempC: fc.double({ min: -20, max: 30, noNaN: true }), rhPercent: fc.double({ min: 0, max: 100, noNaN: true }) })

  it('Glaser line: p ≤ psat everywhere, saturated at each plane, rate ≥ 0 and the flux balances', () => {
    fc.assert(fc.property(fc.array(vapourLayer, { minLength: 1, maxLength: 7 }), climate, climate, (layers, inside, outside) => {
      const r = condensationAt({ layers, inside, outside })
      expect(allFinite(r)).toBe(true)
      for (const i of r.interfaces) expect(i.p).toBeLessThanOrEqual(i.psat * (1 + 1e-9))
      for (const k of r.planes) expect(r.interfaces[k]!.p).toBeCloseTo(r.interfaces[k]!.psat, 6)
      expect(r.rate).toBeGreaterThanOrEqual(0)
      if (r.planes.length === 0) expect(r.rate).toBe(0)
      expect(Math.abs(r.fluxIn - r.fluxOut - r.rate)).toBeLessThan(1e-12)
    }), { numRuns: 300 })
  })

  it('monthly method: never negative, finite, and the months add up', () => {
    fc.assert(fc.property(
      fc.array(vapourLayer, { minLength: 1, maxLength: 5 }),
      fc.array(climate, { minLength: 12, maxLength: 12 }),
      fc.constantFrom(1, 2, 3, 4, 5) as fc.Arbitrary<1 | 2 | 3 | 4 | 5>,
      (layers, months, humidityClass) => {
        const r = condensationYear({ layers, climate: months, internal: { tempC: 20, humidityClass } })
        expect(allFinite(r)).toBe(true)
        for (const m of r.months) expect(m.accumulated_kg_m2).toBeGreaterThanOrEqual(0)
        const total = r.months.reduce((s, m) => s + m.amount_kg_m2, 0)
        expect(Math.abs(total - r.finalAccumulation_kg_m2)).toBeLessThanOrEqual(1e-9 * Math.max(1, r.maxAccumulation_kg_m2))
        expect(r.maxAccumulation_kg_m2).toBeGreaterThanOrEqual(r.finalAccumulation_kg_m2 - 1e-12)
        expect(r.driesOut).toBe(r.finalAccumulation_kg_m2 === 0)
      },
    ), { numRuns: 150 })
  })
})

describe('jointFraction properties', () => {
  it('lies in [0, 1) and grows with the joint', () => {
    fc.assert(fc.property(
      fc.double({ min: 50, max: 1000, noNaN: true }),
      fc.double({ min: 50, max: 1000, noNaN: true }),
      fc.double({ min: 0, max: 25, noNaN: true }),
      (l, h, j) => {
        const f = jointFraction({ unitLength_mm: l, unitHeight_mm: h, joint_mm: j })
        expect(f).toBeGreaterThanOrEqual(0)
        expect(f).toBeLessThan(1)
        expect(jointFraction({ unitLength_mm: l, unitHeight_mm: h, joint_mm: j + 1 })).toBeGreaterThan(f)
      },
    ))
  })
})
