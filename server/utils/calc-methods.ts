import { z } from 'zod'
import {
  bridgingHeatLoss,
  bridgingHeatLossSchema,
  buildProgramme,
  buildProgrammeInput,
  condensationAt,
  condensationAtSchema,
  condensationYear,
  condensationYearSchema,
  dewPoint,
  dewPointSchema,
  mouldRisk,
  mouldRiskSchema,
  saturationPressure,
  thicknessForTargetU,
  thicknessForTargetUSchema,
  uValue,
  uValueSchema,
  wallQuantities,
  wallQuantitiesInput,
} from '../../shared/calc'
import type { DewPointInput } from '../../shared/calc'
import { wallStrength, wallStrengthSchema } from '../../shared/workbench/wall-strength'
import { windAnchors, windAnchorsSchema } from '../../shared/workbench/wind-anchors'

export const DEW_POINT_CAUTION
  = 'Indicative dew point of the air as entered, from the saturation-pressure formulae of EN ISO 13788:2012 '
    + 'Annex E (over ice below 0 °C). Whether a surface or layer reaches it depends on the build-up; a competent '
    + 'designer confirms the assessment.'

/** The dew-point answer: the engine's dew point with the pressures a reader checks it by. */
export function dewPointResult(input: DewPointInput) {
  const psat = saturationPressure(input.tempC)
  return {
    dewPointC: dewPoint(input.tempC, input.rhPercent),
    saturationPressure: psat,
    vapourPressure: input.rhPercent / 100 * psat,
    caution: DEW_POINT_CAUTION,
    standard: ['EN ISO 13788:2012 Annex E saturation vapour pressure'],
  }
}

function method<S extends z.ZodType, R>(label: string, schema: S, run: (input: z.infer<S>) => R) {
  return { label, schema, run }
}

/**
 * Every calculation that can be saved to an enquiry, by the name stored with it. The server re-runs the engine
 * from these on save and on re-run; outputs sent by a client are never stored.
 */
export const calcMethods = {
  'u-value': method('U-value (EN ISO 6946)', uValueSchema, uValue),
  'thickness': method('Insulation thickness for a target U (EN ISO 6946)', thicknessForTargetUSchema, thicknessForTargetU),
  'dew-point': method('Dew point (EN ISO 13788 Annex E)', dewPointSchema, dewPointResult),
  'condensation': method('Interstitial condensation, steady state (EN ISO 13788)', condensationAtSchema, condensationAt),
  'condensation-year': method('Interstitial condensation, monthly (EN ISO 13788)', condensationYearSchema, condensationYear),
  'mould': method('Surface mould, fRsi (EN ISO 13788)', mouldRiskSchema, mouldRisk),
  'bridging': method('Junction heat loss and y-value', bridgingHeatLossSchema, bridgingHeatLoss),
  'wind-anchors': method('Wind on the facade and ETICS anchors (EN 1991-1-4)', windAnchorsSchema, windAnchors),
  'wall-strength': method('Vertical resistance of the wall (EN 1996-1-1 / EN 1996-3)', wallStrengthSchema, wallStrength),
  'quantities': method('Material quantities for the wall and ETICS', wallQuantitiesInput, wallQuantities),
  'programme': method('Masonry programme, single leaf against cavity', buildProgrammeInput, buildProgramme),
} as const

export type CalcMethod = keyof typeof calcMethods
export const calcMethodNames = Object.keys(calcMethods) as [CalcMethod, ...CalcMethod[]]
export const calcMethodSchema = z.enum(calcMethodNames, { error: `Method must be one of: ${calcMethodNames.join(', ')}` })

/**
 * Validates `inputs` with the method's own schema (400 naming the field, prefixed `inputs.`) and runs the
 * engine (422 for the engine's input errors). Returns the parsed inputs, which are what gets stored, and the
 * outputs as they will read back from JSON.
 */
export function runSavedMethod(name: CalcMethod, inputs: unknown): { inputs: unknown, outputs: unknown } {
  const m = calcMethods[name]
  const parsed = m.schema.safeParse(inputs)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    const path = ['inputs', ...issue.path].join('.')
    throw createError({
      statusCode: 400,
      statusMessage: 'Invalid input',
      message: `${path}: ${issue.message}`,
      data: { issues: parsed.error.issues.map(i => ({ path: ['inputs', ...i.path].join('.'), message: i.message })) },
    })
  }
  const outputs = runCalc(() => (m.run as (input: unknown) => unknown)(parsed.data))
  return { inputs: parsed.data, outputs: JSON.parse(JSON.stringify(outputs)) }
}

export interface OutputDifference {
  path: string
  saved: unknown
  current: unknown
}

const MAX_DIFFERENCES = 200

/** Leaf-by-leaf differences between two JSON values, as dotted paths (`months.3.accumulated_kg_m2`). */
export function diffOutputs(saved: unknown, current: unknown, path = '', out: OutputDifference[] = []): OutputDifference[] {
  if (out.length >= MAX_DIFFERENCES) return out
  const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object'
  if (isObject(saved) && isObject(current) && Array.isArray(saved) === Array.isArray(current)) {
    const keys = new Set([...Object.keys(saved), ...Object.keys(current)])
    for (const key of keys) diffOutputs(saved[key], current[key], path ? `${path}.${key}` : key, out)
    return out
  }
  if (saved !== current) out.push({ path: path || '(whole result)', saved: saved ?? null, current: current ?? null })
  return out
}
