import { describe, expect, it } from 'vitest'
import { CalcInputError, mouldRisk, surfaceTemperatureFactor } from '../../../shared/calc/index'

describe('surfaceTemperatureFactor: fRsi = 1 − U·Rsi (recalled from EN ISO 13788:2012 §5, Rsi 0.25)', () => {
  it.each([
    [0.18, 0.25, 0.955], // 1 − 0.045
    [0.3, 0.25, 0.925],
    [1.0, 0.25, 0.75],
    [2.0, 0.25, 0.5],
    [0.3, 0.13, 0.961], // 1 − 0.039
  ])('U %d with Rsi %d → %d', (u, rsi, expected) => {
    expect(surfaceTemperatureFactor(u, rsi)).toBeCloseTo(expected, 12)
  })

  it('uses Rsi 0.25 by default', () => {
    expect(surfaceTemperatureFactor(0.2)).toBeCloseTo(0.95, 12)
  })

  it.each([
    ['u', 0, 0.25],
    ['u', -0.2, 0.25],
    ['u', Number.NaN, 0.25],
    ['rsi', 0.2, 0],
    ['rsi', 0.2, Number.POSITIVE_INFINITY],
  ])('rejects a bad %s', (field, u, rsi) => {
    expect(() => surfaceTemperatureFactor(u, rsi)).toThrow(CalcInputError)
    try {
      surfaceTemperatureFactor(u, rsi)
    }
    catch (e) {
      expect((e as CalcInputError).field).toBe(field)
    }
  })
})

describe('mouldRisk', () => {
  it.each([
    // minimum 0.75 for dwellings, 0.70 at ground-floor 3-D corners — published: TGD L 2019 (Ireland), Appendix D
    [0.18, 'dwelling', 0.75, true],
    [1.0, 'dwelling', 0.75, true], // fRsi exactly 0.75
    [1.2, 'dwelling', 0.75, false], // fRsi 0.70
    [1.1, 'ground-floor-corner', 0.7, true], // fRsi 0.725
    [1.4, 'ground-floor-corner', 0.7, false], // fRsi 0.65
  ] as const)('U %d for %s: minimum %d, pass %s', (u, use, min, pass) => {
    const r = mouldRisk({ u, outsideTempC: 0, use })
    expect(r.fRsiMinForUse).toBe(min)
    expect(r.fRsiMin).toBe(min)
    expect(r.pass).toBe(pass)
    expect(r.fRsiMinSource).toMatch(/^published: Technical Guidance Document L 2019/)
    expect(r.caution).toMatch(/competent designer/)
  })

  it('defaults to a dwelling', () => {
    expect(mouldRisk({ u: 0.2, outsideTempC: 0 }).use).toBe('dwelling')
  })

  it('inside 20 °C 50 %, outside 0 °C: the 80 % surface-RH limit gives fRsi,min 0.631, so 0.75 governs', () => {
    // Derived by hand (EN ISO 13788 §5 criterion, recalled): pi = 1168.48 Pa, limit 1168.48/0.8 = 1460.6 Pa,
    // θsi,min = 237.3·x/(17.269 − x), x = ln(1460.6/610.5) = 0.87234 → 12.625 °C; fRsi,min = 12.625/20 = 0.631
    const r = mouldRisk({ u: 0.3, inside: { tempC: 20, rhPercent: 50 }, outsideTempC: 0 })
    expect(r.fRsiMinForConditions).toBeCloseTo(0.631, 3)
    expect(r.fRsiMin).toBe(0.75)
    expect(r.pass).toBe(true)
    // θsi = 0 + 0.925·20 = 18.5 °C
    expect(r.surfaceTempC).toBeCloseTo(18.5, 9)
    expect(r.surfaceRhPercent!).toBeLessThan(80)
  })

  it('inside 20 °C 70 %, outside 0 °C: the conditions govern with fRsi,min 0.893', () => {
    // pi = 1635.87 Pa, limit 2044.8 Pa, x = ln(3.34939) = 1.20878, θsi,min = 286.84/16.0602 = 17.86 °C → 0.893
    const r = mouldRisk({ u: 0.6, inside: { tempC: 20, rhPercent: 70 }, outsideTempC: 0 })
    expect(r.fRsiMinForConditions).toBeCloseTo(0.893, 3)
    expect(r.fRsiMin).toBeCloseTo(0.893, 3)
    expect(r.fRsi).toBeCloseTo(0.85, 12)
    expect(r.pass).toBe(false)
    expect(r.surfaceRhPercent!).toBeGreaterThan(80)
  })

  it.each([
    ['inside.tempC', { u: 0.3, inside: { tempC: -5, rhPercent: 50 }, outsideTempC: 0 }],
    ['inside.rhPercent', { u: 0.3, inside: { tempC: 20, rhPercent: 120 }, outsideTempC: 0 }],
    ['outsideTempC', { u: 0.3, outsideTempC: Number.NaN }],
    ['u', { u: -1, outsideTempC: 0 }],
    ['use', { u: 0.3, outsideTempC: 0, use: 'warehouse' }],
  ])('rejects a bad %s', (field, input) => {
    let error: unknown
    try {
      mouldRisk(input as never)
    }
    catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(CalcInputError)
    expect((error as CalcInputError).field).toBe(field)
  })
})
