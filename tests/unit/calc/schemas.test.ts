import { describe, expect, it } from 'vitest'
import {
  bridgingHeatLossSchema,
  condensationAtSchema,
  condensationYearSchema,
  dewPointSchema,
  jointFractionSchema,
  mouldRiskSchema,
  thicknessForTargetUSchema,
  uValue,
  uValueSchema,
} from '../../../shared/calc/index'

// The forms and the API parse with these schemas, then hand the result to the engine unchanged.
const wall = {
  layers: [
    { name: 'Block', thickness_mm: 215, lambda: 0.29, bridge: { lambda: 0.83, fraction: 0.0204 } },
    { name: 'Cavity', resistance: 0.18 },
    { name: 'EPS', thickness_mm: 150, lambda: 0.031 },
  ],
  fixings: { layerIndex: 2, perM2: 6, diameter_mm: 4, lambda: 50 },
  airGapLevel: 1,
}

describe('schemas agree with the engine', () => {
  it('a parsed U-value input gives the same result as the raw one', () => {
    const parsed = uValueSchema.parse(wall)
    expect(uValue(parsed)).toEqual(uValue(wall as never))
  })

  it.each([
    ['bridge fraction 1', { ...wall, layers: [{ thickness_mm: 100, lambda: 0.5, bridge: { lambda: 0.9, fraction: 1 } }] }],
    ['zero thickness', { ...wall, layers: [{ thickness_mm: 0, lambda: 0.5 }] }],
    ['λ ≤ 0', { ...wall, layers: [{ thickness_mm: 100, lambda: 0 }] }],
    ['no layers', { ...wall, layers: [] }],
    ['fixing past the layers', { ...wall, fixings: { ...wall.fixings, layerIndex: 7 } }],
    ['air-gap level 3', { ...wall, airGapLevel: 3 }],
    ['infinite λ', { ...wall, layers: [{ thickness_mm: 100, lambda: Number.POSITIVE_INFINITY }] }],
  ])('uValueSchema rejects %s', (_label, input) => {
    expect(uValueSchema.safeParse(input).success).toBe(false)
  })

  it.each([
    ['jointFraction', jointFractionSchema, { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3 }, { unitLength_mm: 440, unitHeight_mm: 215, joint_mm: -1 }],
    ['thicknessForTargetU', thicknessForTargetUSchema, { ...wall, layerIndex: 2, targetU: 0.15 }, { ...wall, layerIndex: 9, targetU: 0.15 }],
    ['dewPoint', dewPointSchema, { tempC: 20, rhPercent: 50 }, { tempC: 20, rhPercent: 101 }],
    ['condensationAt', condensationAtSchema,
      { layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }, { resistance: 0.01, sd: 2 }], inside: { tempC: 20, rhPercent: 50 }, outside: { tempC: 0, rhPercent: 80 } },
      { layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }], inside: { tempC: 20, rhPercent: 150 }, outside: { tempC: 0, rhPercent: 80 } }],
    ['condensationYear', condensationYearSchema,
      { layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }], climate: Array.from({ length: 12 }, () => ({ tempC: 5, rhPercent: 80 })), internal: { tempC: 20, humidityClass: 3 } },
      { layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }], climate: Array.from({ length: 11 }, () => ({ tempC: 5, rhPercent: 80 })), internal: { tempC: 20, humidityClass: 3 } }],
    ['mouldRisk', mouldRiskSchema, { u: 0.3, outsideTempC: 0, use: 'dwelling' }, { u: 0.3, outsideTempC: 0, use: 'warehouse' }],
    ['bridgingHeatLoss', bridgingHeatLossSchema, { junctions: [{ psi: 0.05, length_m: 10 }], exposedArea_m2: 100 }, { junctions: [{ psi: 0.05, length_m: 10 }], exposedArea_m2: 0 }],
  ] as const)('%s schema: accepts a good input and rejects a bad one', (_name, schema, good, bad) => {
    expect(schema.safeParse(good).success).toBe(true)
    expect(schema.safeParse(bad).success).toBe(false)
  })

  it('a humidity class outside 1–5 is rejected', () => {
    const r = condensationYearSchema.safeParse({ layers: [{ thickness_mm: 100, lambda: 0.04, mu: 1 }], climate: Array.from({ length: 12 }, () => ({ tempC: 5, rhPercent: 80 })), internal: { tempC: 20, humidityClass: 6 } })
    expect(r.success).toBe(false)
  })
})
