/**
 * Input schemas of the thermal and moisture methods, shared by the workbench forms, the API routes and the
 * engine itself (the engine imports only the inferred types; its own checks throw CalcInputError so that it
 * runs without zod). Optional fields stay optional here, without zod defaults, so that the parsed value and
 * the engine's input type are the same type; the engine applies the defaults and documents them.
 */
import { z } from 'zod'

const finite = (label: string) => z.number({ error: `${label} must be a number` })
const positive = (label: string) => finite(label).gt(0, `${label} must be greater than zero`)
const rh = (label: string) => finite(label).min(0, `${label} must be 0–100 %`).max(100, `${label} must be 0–100 %`)
const temperature = (label: string) => finite(label).min(-60, `${label} must be at least −60 °C`).max(80, `${label} must be at most 80 °C`)
const surfaceResistance = (label: string) => finite(label).min(0, `${label} cannot be negative`).max(1, `${label} above 1 m²K/W is not a surface resistance`)

/** EN 1996-1-1 unit face and joint, for the mortar-joint area fraction. */
export const jointFractionSchema = z.object({
  unitLength_mm: positive('Unit length'),
  unitHeight_mm: positive('Unit height'),
  joint_mm: finite('Joint thickness').min(0, 'Joint thickness cannot be negative').max(50, 'Joint thickness above 50 mm is not a masonry joint'),
})
export type JointFractionInput = z.infer<typeof jointFractionSchema>

export const bridgeSchema = z.object({
  lambda: positive('Bridge λ'),
  fraction: finite('Bridge fraction').gt(0, 'Bridge fraction must be above 0 (use an unbridged layer)').lt(1, 'Bridge fraction must be below 1 (use an unbridged layer of the bridging material)'),
})

/** A layer of given thickness and design λ, optionally bridged (EN ISO 6946 §6.7.2). */
export const thermalLayerSchema = z.object({
  name: z.string().max(120).optional(),
  thickness_mm: positive('Layer thickness'),
  lambda: positive('Layer λ'),
  bridge: bridgeSchema.optional(),
})

/** An air layer or a declared thermal resistance. */
export const resistanceLayerSchema = z.object({
  name: z.string().max(120).optional(),
  resistance: positive('Layer resistance').max(20, 'Layer resistance above 20 m²K/W is not plausible'),
})

export const uValueLayerSchema = z.union([thermalLayerSchema, resistanceLayerSchema])
export type UValueLayer = z.infer<typeof uValueLayerSchema>

/** A mechanical fastener crossing an insulation layer (EN ISO 6946 Annex F.3). */
export const fixingSchema = z.object({
  layerIndex: z.number().int().min(0, 'Fixing layer index cannot be negative'),
  perM2: finite('Fixings per m²').min(0, 'Fixings per m² cannot be negative').max(100, 'More than 100 fixings per m² is not plausible'),
  diameter_mm: positive('Fixing diameter').max(50, 'Fixing diameter above 50 mm is not plausible'),
  lambda: positive('Fixing λ'),
  penetration_mm: positive('Fixing penetration').optional(),
})
export type FixingInput = z.infer<typeof fixingSchema>

/** A point thermal bridge declared per anchor (χ, W/K), counted per m². */
export const pointBridgeSchema = z.object({
  perM2: finite('Anchors per m²').min(0, 'Anchors per m² cannot be negative').max(100, 'More than 100 anchors per m² is not plausible'),
  chi: finite('Point transmittance χ').min(0, 'χ cannot be negative').max(0.1, 'χ above 0.1 W/K per anchor is not plausible'),
})
export type PointBridgeInput = z.infer<typeof pointBridgeSchema>

const uValueFields = {
  layers: z.array(uValueLayerSchema).min(1, 'Add at least one layer').max(20, 'At most 20 layers'),
  rsi: surfaceResistance('Rsi').optional(),
  rse: surfaceResistance('Rse').optional(),
  fixings: z.union([fixingSchema, z.array(fixingSchema).max(10)]).optional(),
  pointBridges: z.array(pointBridgeSchema).max(10).optional(),
  airGapLevel: z.union([z.literal(0), z.literal(1), z.literal(2)]).optional(),
  airGapLayerIndex: z.number().int().min(0).optional(),
}

function fixingsWithinLayers(v: { layers: unknown[], fixings?: FixingInput | FixingInput[] }): boolean {
  const list = v.fixings === undefined ? [] : Array.isArray(v.fixings) ? v.fixings : [v.fixings]
  return list.every(f => f.layerIndex < v.layers.length)
}

/** EN ISO 6946:2017 combined method with the Annex F corrections. */
export const uValueSchema = z.object(uValueFields).refine(fixingsWithinLayers, {
  error: 'A fixing points at a layer that does not exist',
  path: ['fixings'],
})
export type UValueInput = z.infer<typeof uValueSchema>

/** Least thickness of one layer that reaches a target U. */
export const thicknessForTargetUSchema = z.object({
  ...uValueFields,
  layerIndex: z.number().int().min(0, 'Layer index cannot be negative'),
  targetU: positive('Target U').max(10, 'Target U above 10 W/m²K is not plausible'),
  step_mm: positive('Step').max(100, 'Step above 100 mm is too coarse').optional(),
  maxThickness_mm: positive('Maximum thickness').max(1000, 'Maximum thickness above 1000 mm is not plausible').optional(),
}).refine(v => v.layerIndex < v.layers.length, { error: 'The layer to size does not exist', path: ['layerIndex'] })
  .refine(fixingsWithinLayers, { error: 'A fixing points at a layer that does not exist', path: ['fixings'] })
export type ThicknessForTargetUInput = z.infer<typeof thicknessForTargetUSchema>

export const saturationPressureSchema = z.object({ tempC: temperature('Temperature') })
export type SaturationPressureInput = z.infer<typeof saturationPressureSchema>

export const dewPointSchema = z.object({
  tempC: temperature('Temperature'),
  rhPercent: finite('Relative humidity').gt(0, 'Relative humidity must be above 0 %').max(100, 'Relative humidity cannot exceed 100 %'),
})
export type DewPointInput = z.infer<typeof dewPointSchema>

export const climatePointSchema = z.object({ tempC: temperature('Temperature'), rhPercent: rh('Relative humidity') })
export type ClimatePoint = z.infer<typeof climatePointSchema>

/** A layer for the Glaser method: thickness, λ and μ, or a resistance with its sd. */
export const vapourThermalLayerSchema = z.object({
  name: z.string().max(120).optional(),
  thickness_mm: positive('Layer thickness'),
  lambda: positive('Layer λ'),
  mu: positive('Layer μ').max(1e7, 'μ above 10⁷ is not plausible'),
})
export const vapourResistanceLayerSchema = z.object({
  name: z.string().max(120).optional(),
  resistance: positive('Layer resistance').max(20, 'Layer resistance above 20 m²K/W is not plausible'),
  sd: positive('Layer sd').max(10000, 'sd above 10 000 m is not plausible'),
})
export const vapourLayerSchema = z.union([vapourThermalLayerSchema, vapourResistanceLayerSchema])
export type VapourLayer = z.infer<typeof vapourLayerSchema>

/** EN ISO 13788 Glaser profile for one set of conditions. */
export const condensationAtSchema = z.object({
  layers: z.array(vapourLayerSchema).min(1, 'Add at least one layer').max(20, 'At most 20 layers'),
  inside: climatePointSchema,
  outside: climatePointSchema,
  rsi: surfaceResistance('Rsi').optional(),
  rse: surfaceResistance('Rse').optional(),
})
export type CondensationAtInput = z.infer<typeof condensationAtSchema>

export const internalConditionsSchema = z.union([
  z.object({ tempC: temperature('Internal temperature'), rhPercent: rh('Internal relative humidity') }),
  z.object({
    tempC: temperature('Internal temperature'),
    humidityClass: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4), z.literal(5)]),
  }),
])
export type InternalConditions = z.infer<typeof internalConditionsSchema>

/** EN ISO 13788 §6 monthly assessment over a year. */
export const condensationYearSchema = z.object({
  layers: z.array(vapourLayerSchema).min(1, 'Add at least one layer').max(20, 'At most 20 layers'),
  climate: z.array(climatePointSchema).length(12, 'Give twelve months of climate, January first'),
  internal: internalConditionsSchema,
  rsi: surfaceResistance('Rsi').optional(),
  rse: surfaceResistance('Rse').optional(),
})
export type CondensationYearInput = z.infer<typeof condensationYearSchema>

export const surfaceTemperatureFactorSchema = z.object({
  u: positive('U-value').max(10, 'U above 10 W/m²K is not plausible'),
  rsi: positive('Rsi').max(1, 'Rsi above 1 m²K/W is not plausible').optional(),
})
export type SurfaceTemperatureFactorInput = z.infer<typeof surfaceTemperatureFactorSchema>

export const mouldUseSchema = z.enum(['dwelling', 'ground-floor-corner'])
export type MouldUse = z.infer<typeof mouldUseSchema>

export const mouldRiskSchema = z.object({
  u: positive('U-value').max(10, 'U above 10 W/m²K is not plausible'),
  inside: climatePointSchema.optional(),
  outsideTempC: temperature('Outside temperature'),
  use: mouldUseSchema.optional(),
})
export type MouldRiskInput = z.infer<typeof mouldRiskSchema>

export const junctionSchema = z.object({
  name: z.string().max(120).optional(),
  psi: finite('ψ').min(-2, 'ψ below −2 W/mK is not plausible').max(2, 'ψ above 2 W/mK is not plausible'),
  length_m: finite('Junction length').min(0, 'Junction length cannot be negative').max(100000, 'Junction length is not plausible'),
})
export type JunctionInput = z.infer<typeof junctionSchema>

/** Heat loss through linear bridges and the equivalent y-value. */
export const bridgingHeatLossSchema = z.object({
  junctions: z.array(junctionSchema).max(200, 'At most 200 junctions'),
  exposedArea_m2: positive('Exposed area').max(1e6, 'Exposed area is not plausible'),
  points: z.array(z.object({
    name: z.string().max(120).optional(),
    chi: finite('χ').min(-1, 'χ below −1 W/K is not plausible').max(1, 'χ above 1 W/K is not plausible'),
    count: z.number().int().min(0, 'Count cannot be negative'),
  })).max(200).optional(),
})
export type BridgingHeatLossInput = z.infer<typeof bridgingHeatLossSchema>
