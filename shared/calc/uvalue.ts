import { CalcInputError, requireFinite, requirePositive, requireRange } from './errors'
import type { FixingInput, JointFractionInput, ThicknessForTargetUInput, UValueInput, UValueLayer } from './schemas'

/** EN ISO 6946:2017 §6.8 / Table 7, horizontal heat flow [recalled]. */
export const RSI_HORIZONTAL = 0.13
export const RSE = 0.04

/** ΔU'' by air-gap correction level, EN ISO 6946:2017 Annex F.2 [recalled]. */
const AIR_GAP_DELTA_U = [0, 0.01, 0.04] as const

/** Below this fastener λ (W/mK) Annex F.3 asks for no correction [recalled]. */
const FASTENER_LAMBDA_LIMIT = 1

/** Above this bridge λ the bridge is treated as metal, for which the combined method is not valid. */
const METAL_LAMBDA = 10

/** Bridged layers beyond this make 2ⁿ paths: a build-up this complex needs a numerical model anyway. */
const MAX_BRIDGED_LAYERS = 10

export const U_VALUE_CAUTION
  = 'Indicative U-value by the combined method of EN ISO 6946:2017, to inform design. It is not a compliance '
    + 'certificate: a competent designer confirms the build-up, the declared λ values and the corrections under '
    + 'the local building regulations.'

export interface UValueResult {
  /** Upper limit R'T over the parallel heat-flow paths, m²K/W. */
  upperR: number
  /** Lower limit R''T with equivalent λ'' in each bridged layer, m²K/W. */
  lowerR: number
  /** RT = (R'T + R''T)/2, m²K/W. */
  totalR: number
  /** Maximum relative error e = (R'T − R''T)/(2 RT). */
  relativeError: number
  /** RT,h: the build-up with every bridge ignored, used by the fastener correction. */
  homogeneousR: number
  /** Air-gap correction ΔUg, W/m²K. */
  deltaUg: number
  /** Mechanical-fastener correction ΔUf, W/m²K. */
  deltaUf: number
  /** Point transmittances n·χ of declared anchors, W/m²K. */
  deltaUchi: number
  /** 1/RT before corrections, W/m²K. */
  uUncorrected: number
  /** 1/RT + ΔUg + ΔUf + Σ n·χ, W/m²K, unrounded. */
  u: number
  /** u to two significant figures, as the standard asks a result to be stated. */
  uRounded: number
  /** True when all corrections together are below 3 % of U, where the standard would permit omitting them. */
  correctionsBelowThreshold: boolean
  /** Per-path detail of the upper limit. */
  paths: { fraction: number, resistance: number }[]
  /** Specific remarks about this input (validity limits, ignored fasteners). */
  notes: string[]
  caution: string
  standard: string[]
}

/**
 * Area fraction of mortar in a masonry layer, f = 1 − l·h / ((l + j)(h + j)), for a unit face l × h laid with
 * joints j on both bed and perpend (the bridged-layer fraction for EN ISO 6946 §6.7.2).
 */
export function jointFraction(input: JointFractionInput): number {
  const l = requirePositive('unitLength_mm', input?.unitLength_mm)
  const h = requirePositive('unitHeight_mm', input?.unitHeight_mm)
  const j = requireRange('joint_mm', input?.joint_mm, 0, 50)
  return 1 - (l * h) / ((l + j) * (h + j))
}

interface ResolvedLayer {
  /** Resistance of the main material, m²K/W. */
  r: number
  /** Resistance of the bridging material, when bridged. */
  rBridge?: number
  fraction?: number
  /** Resistance with λ'' = (1 − f)λ + fλb, for the lower limit. */
  rLower: number
  thickness_m?: number
  lambda?: number
}

function resolveLayers(layers: unknown): ResolvedLayer[] {
  if (!Array.isArray(layers) || layers.length === 0) {
    throw new CalcInputError('layers', 'Add at least one layer to the build-up')
  }
  return layers.map((raw: UValueLayer, i) => {
    const field = `layers[${i}]`
    if (raw === null || typeof raw !== 'object') throw new CalcInputError(field, `Layer ${i + 1} is not a layer`)
    if ('resistance' in raw && raw.resistance !== undefined) {
      const r = requirePositive(`${field}.resistance`, raw.resistance)
      return { r, rLower: r }
    }
    const l = raw as { thickness_mm?: unknown, lambda?: unknown, bridge?: { lambda?: unknown, fraction?: unknown } }
    const d = requirePositive(`${field}.thickness_mm`, l.thickness_mm) / 1000
    const lambda = requirePositive(`${field}.lambda`, l.lambda)
    const r = d / lambda
    if (l.bridge === undefined) return { r, rLower: r, thickness_m: d, lambda }
    const lb = requirePositive(`${field}.bridge.lambda`, l.bridge?.lambda)
    const f = requireFinite(`${field}.bridge.fraction`, l.bridge?.fraction)
    if (f <= 0 || f >= 1) {
      throw new CalcInputError(`${field}.bridge.fraction`,
        `The bridge fraction of layer ${i + 1} must lie between 0 and 1 (got ${f}); the two fractions of a bridged layer sum to 1`)
    }
    return { r, rBridge: d / lb, fraction: f, rLower: d / ((1 - f) * lambda + f * lb), thickness_m: d, lambda }
  })
}

function normaliseFixings(fixings: UValueInput['fixings']): FixingInput[] {
  if (fixings === undefined) return []
  return Array.isArray(fixings) ? fixings : [fixings]
}

/**
 * Thermal transmittance of a building element by the combined method of EN ISO 6946:2017 §6.7.2: the upper
 * limit R'T over every combination of bridged sections, the lower limit R''T with an equivalent λ'' per bridged
 * layer, RT their mean. Corrections of Annex F: air gaps ΔUg = ΔU''·(R1/RT)² (level 0/1/2) and fasteners
 * ΔUf = α·λf·Af·nf/d1·(R1/RT,h)²; declared point transmittances of anchors add n·χ.
 *
 * Decision on the 3 % rule: the standard lets a designer omit the corrections when together they are below 3 %
 * of U, but never requires the omission. `u` always includes every correction computed here, so that U never
 * jumps as an input crosses the threshold and the stated value is the more cautious one;
 * `correctionsBelowThreshold` tells the reader where omitting them would have been allowed.
 */
export function uValue(input: UValueInput): UValueResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the build-up to calculate')
  const layers = resolveLayers(input.layers)
  const rsi = input.rsi === undefined ? RSI_HORIZONTAL : requireRange('rsi', input.rsi, 0, 1)
  const rse = input.rse === undefined ? RSE : requireRange('rse', input.rse, 0, 1)
  const airGapLevel = input.airGapLevel ?? 0
  if (airGapLevel !== 0 && airGapLevel !== 1 && airGapLevel !== 2) {
    throw new CalcInputError('airGapLevel', 'The air-gap correction level must be 0, 1 or 2')
  }
  const notes: string[] = []

  const bridged = layers.filter(l => l.fraction !== undefined)
  if (bridged.length > MAX_BRIDGED_LAYERS) {
    throw new CalcInputError('layers', `At most ${MAX_BRIDGED_LAYERS} bridged layers; model a build-up this complex numerically (EN ISO 10211)`)
  }
  const surfaces = rsi + rse
  const homogeneousR = surfaces + layers.reduce((s, l) => s + l.r, 0)

  // Each bridged layer splits every path in two, weighted by its fractions; independent layouts are assumed,
  // as in the published worked examples.
  let paths = [{ fraction: 1, resistance: surfaces }]
  for (const layer of layers) {
    if (layer.fraction === undefined || layer.rBridge === undefined) {
      for (const p of paths) p.resistance += layer.r
      continue
    }
    const f = layer.fraction
    const rb = layer.rBridge
    paths = paths.flatMap(p => [
      { fraction: p.fraction * (1 - f), resistance: p.resistance + layer.r },
      { fraction: p.fraction * f, resistance: p.resistance + rb },
    ])
  }
  const upperR = 1 / paths.reduce((s, p) => s + p.fraction / p.resistance, 0)
  const lowerR = surfaces + layers.reduce((s, l) => s + l.rLower, 0)
  const totalR = (upperR + lowerR) / 2
  const relativeError = (upperR - lowerR) / (2 * totalR)

  if (upperR / lowerR > 1.5) {
    notes.push('The upper limit exceeds 1.5 times the lower limit: the combined method is not valid here (EN ISO 6946 §6.7.2); use a numerical model to EN ISO 10211.')
  }
  if (layers.some(l => l.rBridge !== undefined && l.thickness_m !== undefined && l.thickness_m / l.rBridge >= METAL_LAMBDA)) {
    notes.push('A layer is bridged by metal: the combined method does not cover metal bridging of insulation; use a numerical model to EN ISO 10211.')
  }

  // Air gaps, Annex F.2: R1 is the layer holding the gaps; unless named, the layer of largest resistance,
  // which in a wall is the insulation the level describes.
  let deltaUg = 0
  if (airGapLevel > 0) {
    let gapIndex: number
    if (input.airGapLayerIndex !== undefined) {
      gapIndex = requireRange('airGapLayerIndex', input.airGapLayerIndex, 0, layers.length - 1)
      if (!Number.isInteger(gapIndex)) throw new CalcInputError('airGapLayerIndex', 'The air-gap layer index must be a whole number')
    }
    else {
      gapIndex = layers.reduce((best, l, i) => (l.r > layers[best]!.r ? i : best), 0)
    }
    const r1 = layers[gapIndex]!.r
    deltaUg = AIR_GAP_DELTA_U[airGapLevel] * (r1 / totalR) ** 2
  }

  let deltaUf = 0
  normaliseFixings(input.fixings).forEach((fx, i) => {
    const field = `fixings[${i}]`
    if (fx === null || typeof fx !== 'object') throw new CalcInputError(field, `Fixing ${i + 1} is not a fixing`)
    const index = requireRange(`${field}.layerIndex`, fx.layerIndex, 0, layers.length - 1)
    if (!Number.isInteger(index)) throw new CalcInputError(`${field}.layerIndex`, 'The fixing layer index must be a whole number')
    const layer = layers[index]!
    if (layer.thickness_m === undefined || layer.lambda === undefined) {
      throw new CalcInputError(`${field}.layerIndex`, 'A fixing must cross a layer given by thickness and λ, not a declared resistance')
    }
    const n = requireRange(`${field}.perM2`, fx.perM2, 0, 100)
    const diameter = requirePositive(`${field}.diameter_mm`, fx.diameter_mm) / 1000
    const lambdaF = requirePositive(`${field}.lambda`, fx.lambda)
    const d0 = layer.thickness_m
    const d1 = fx.penetration_mm === undefined ? d0 : requirePositive(`${field}.penetration_mm`, fx.penetration_mm) / 1000
    if (d1 > d0 * (1 + 1e-9)) {
      throw new CalcInputError(`${field}.penetration_mm`, `The fixing cannot penetrate further than the layer is thick (${d0 * 1000} mm)`)
    }
    if (lambdaF < FASTENER_LAMBDA_LIMIT) {
      notes.push(`Fixing ${i + 1}: λ below 1 W/mK, so Annex F asks for no correction.`)
      return
    }
    // Recessed (d1 < d0): α = 0.8·d1/d0 and R1 = d1/λ, the insulation the fastener actually crosses
    // [recalled: EN ISO 6946:2017 F.3]; a fastener through the whole layer has α = 0.8 and R1 the layer's R.
    const recessed = d1 < d0 * (1 - 1e-9)
    const alpha = recessed ? 0.8 * d1 / d0 : 0.8
    const r1 = d1 / layer.lambda
    const area = Math.PI * diameter ** 2 / 4
    deltaUf += alpha * lambdaF * area * n / d1 * (r1 / homogeneousR) ** 2
  })

  let deltaUchi = 0
  ;(input.pointBridges ?? []).forEach((pb, i) => {
    const n = requireRange(`pointBridges[${i}].perM2`, pb?.perM2, 0, 100)
    const chi = requireRange(`pointBridges[${i}].chi`, pb?.chi, 0, 0.1)
    deltaUchi += n * chi
  })

  const uUncorrected = 1 / totalR
  const corrections = deltaUg + deltaUf + deltaUchi
  const u = uUncorrected + corrections
  const correctionsBelowThreshold = corrections < 0.03 * u
  if (corrections > 0 && correctionsBelowThreshold) {
    notes.push('The corrections are below 3 % of U; the standard would allow omitting them, but U includes them.')
  }

  return {
    upperR,
    lowerR,
    totalR,
    relativeError,
    homogeneousR,
    deltaUg,
    deltaUf,
    deltaUchi,
    uUncorrected,
    u,
    uRounded: roundSignificant(u, 2),
    correctionsBelowThreshold,
    paths,
    notes,
    caution: U_VALUE_CAUTION,
    standard: [
      'EN ISO 6946:2017 §6.7.2 combined method (upper and lower limits)',
      'EN ISO 6946:2017 Annex F.2 air gaps, F.3 mechanical fasteners',
      'Surface resistances EN ISO 6946:2017 Table 7 (horizontal heat flow by default)',
    ],
  }
}

/** Rounds to `digits` significant figures; for 0.10–0.99 that is two decimals, as EN ISO 6946 states U. */
export function roundSignificant(value: number, digits: number): number {
  if (value === 0 || !Number.isFinite(value)) return value
  const factor = 10 ** (digits - 1 - Math.floor(Math.log10(Math.abs(value))))
  // Half-up on the decimal figure a person reads: 0.155 is stored as 0.15499…, and should still give 0.16.
  const scaled = Math.abs(value) * factor
  const rounded = Math.round(scaled * (1 + 1e-12)) / factor
  return Math.sign(value) * Number(rounded.toPrecision(15))
}

export interface ThicknessForTargetUResult {
  /** Least thickness of the sized layer, in whole steps, that reaches the target, mm. */
  thickness_mm: number
  u: number
  uRounded: number
  targetU: number
  result: UValueResult
  caution: string
  standard: string[]
}

/**
 * Least thickness of layer `layerIndex`, in steps of `step_mm` (default 10 mm) up to `maxThickness_mm`
 * (default 500 mm), at which the U of EN ISO 6946:2017 (combined method with corrections, see `uValue`) is at
 * or below `targetU`. The unrounded U is compared, so a value that merely rounds to the target does not pass.
 * A recessed fixing in the sized layer keeps its recess depth as the layer grows.
 */
export function thicknessForTargetU(input: ThicknessForTargetUInput): ThicknessForTargetUResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the build-up to size')
  const targetU = requirePositive('targetU', input.targetU)
  if (targetU > 10) throw new CalcInputError('targetU', `A target U above 10 W/m²K is not plausible (got ${targetU})`)
  const step = input.step_mm === undefined ? 10 : requireRange('step_mm', input.step_mm, 1e-3, 100)
  const max = input.maxThickness_mm === undefined ? 500 : requireRange('maxThickness_mm', input.maxThickness_mm, step, 1000)
  if (!Array.isArray(input.layers)) throw new CalcInputError('layers', 'Add at least one layer to the build-up')
  const index = requireRange('layerIndex', input.layerIndex, 0, input.layers.length - 1)
  if (!Number.isInteger(index)) throw new CalcInputError('layerIndex', 'The layer index must be a whole number')
  const sized = input.layers[index]
  if (!sized || !('thickness_mm' in sized)) {
    throw new CalcInputError('layerIndex', 'The layer to size must be given by thickness and λ, not a declared resistance')
  }
  // Validate the build-up once at its given thickness so errors name the user's own input.
  uValue(input)

  const fixings = normaliseFixings(input.fixings)
  const recess = fixings.map(f => (f.layerIndex === index && f.penetration_mm !== undefined ? sized.thickness_mm - f.penetration_mm : 0))
  const steps = Math.floor(max / step + 1e-9)
  for (let k = 1; k <= steps; k++) {
    const t = k * step
    if (recess.some((r, i) => fixings[i]!.layerIndex === index && t - r <= 0)) continue
    const layers = input.layers.map((l, i) => (i === index ? { ...sized, thickness_mm: t } : l))
    const fx = fixings.map((f, i) => (f.layerIndex === index && f.penetration_mm !== undefined ? { ...f, penetration_mm: t - recess[i]! } : f))
    const result = uValue({ ...input, layers, fixings: fx })
    if (result.u <= targetU) {
      return {
        thickness_mm: roundSignificant(t, 12),
        u: result.u,
        uRounded: result.uRounded,
        targetU,
        result,
        caution: U_VALUE_CAUTION,
        standard: result.standard,
      }
    }
  }
  throw new CalcInputError('targetU',
    `U = ${targetU} W/m²K cannot be reached by this layer within ${max} mm; use a better insulant or change another layer`)
}
