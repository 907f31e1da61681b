/**
 * Input schemas of the wind, masonry, quantities, programme and quotation methods, for the workbench forms and
 * the API routes. The engine does its own checks (CalcInputError) and runs without zod; these schemas reject bad
 * input earlier with messages for the form. No zod defaults: the parsed value has the engine's input type and the
 * engine applies and documents the defaults. The assignments at the end of the file fail to compile if a schema
 * and the engine's input type drift apart.
 */
import { z } from 'zod'
import { QUANTITY_ITEMS } from './quantities'
import type { AnchorLayoutInput, AnchorsPerM2Input, PeakVelocityPressureInput, WallPressureCoefficientsInput } from './wind'
import type { CharacteristicStrengthInput, NormalisedStrengthInput, VerticalResistanceInput } from './masonry'
import type { BlocksPerM2Input, MortarPerM2Input, WallQuantitiesInput } from './quantities'
import type { BuildProgrammeInput } from './programme'
import type { QuoteInput } from './quote'

const num = (label: string) => z.number({ error: `${label} must be a number` })
const pos = (label: string) => num(label).gt(0, `${label} must be greater than zero`)
const nonNeg = (label: string) => num(label).min(0, `${label} cannot be negative`)
const between = (label: string, min: number, max: number) =>
  num(label).min(min, `${label} must be at least ${min}`).max(max, `${label} must be at most ${max}`)
const cents = (label: string) => z.number({ error: `${label} must be a number` }).int(`${label} must be whole cents`).min(0, `${label} cannot be negative`)
const text = (label: string, max = 200) => z.string({ error: `${label} must be text` }).trim().min(1, `${label} is required`).max(max)

// ---- wind (EN 1991-1-4) ----------------------------------------------------------------------------------------

export const terrainCategoryInput = z.enum(['0', 'I', 'II', 'III', 'IV'], { error: 'Terrain category must be 0, I, II, III or IV' })

export const peakVelocityPressureInput = z.object({
  vb: pos('Basic wind velocity vb').max(80, 'Basic wind velocity above 80 m/s is not plausible'),
  z: pos('Reference height z').max(200, 'Reference height must be at most 200 m'),
  terrain: terrainCategoryInput,
  co: pos('Orography factor co').max(3, 'Orography factor above 3 is not plausible').optional(),
  rho: pos('Air density').max(2, 'Air density above 2 kg/m³ is not plausible').optional(),
})
export type PeakVelocityPressureInputParsed = z.infer<typeof peakVelocityPressureInput>

export const wallPressureCoefficientsInput = z.object({
  b: pos('Crosswind dimension b'),
  d: pos('In-wind dimension d'),
  h: pos('Building height h').max(200, 'Building height must be at most 200 m'),
  loadedArea_m2: pos('Loaded area'),
})
export type WallPressureCoefficientsInputParsed = z.infer<typeof wallPressureCoefficientsInput>

const anchorPatterns = z.array(pos('Anchor pattern')).max(20).optional()

export const anchorsPerM2Input = z.object({
  qp: pos('Peak velocity pressure qp'),
  cpe: num('cpe').min(-3, 'cpe below −3 is not plausible').max(3, 'cpe above 3 is not plausible'),
  anchorResistance_kN: pos('Anchor design resistance'),
  gammaQ: between('γQ', 1, 3).optional(),
  minimumPerM2: between('Minimum anchors per m²', 0, 100).optional(),
  patterns: anchorPatterns,
})
export type AnchorsPerM2InputParsed = z.infer<typeof anchorsPerM2Input>

export const anchorLayoutZoneInput = z.object({
  zone: text('Zone', 20),
  area_m2: nonNeg('Zone area'),
  cpe: num('Zone cpe').min(-3, 'cpe below −3 is not plausible').max(3, 'cpe above 3 is not plausible'),
  edge: z.boolean().optional(),
})

export const anchorLayoutInput = z.object({
  qp: pos('Peak velocity pressure qp'),
  anchorResistance_kN: pos('Anchor design resistance'),
  gammaQ: between('γQ', 1, 3).optional(),
  minimumPerM2: between('Minimum anchors per m²', 0, 100).optional(),
  patterns: anchorPatterns,
  zones: z.array(anchorLayoutZoneInput).min(1, 'List at least one zone').max(50),
})
export type AnchorLayoutInputParsed = z.infer<typeof anchorLayoutInput>

// ---- masonry (EN 772-1, EN 1996-1-1, EN 1996-3) ----------------------------------------------------------------

export const normalisedStrengthInput = z.object({
  meanStrength: pos('Mean compressive strength').max(200, 'Mean strength above 200 N/mm² is not plausible'),
  unitHeight_mm: num('Specimen height').min(40, 'Specimen height must be at least 40 mm for the shape-factor table'),
  unitWidth_mm: num('Specimen width').min(50, 'Specimen width must be at least 50 mm for the shape-factor table'),
  conditioning: z.enum(['air-dry', 'oven-dry', 'moisture-6pc', 'water-soaked'], { error: 'Choose how the specimens were conditioned' }),
})
export type NormalisedStrengthInputParsed = z.infer<typeof normalisedStrengthInput>

export const characteristicStrengthInput = z
  .object({
    fb: pos('fb').max(200, 'fb above 200 N/mm² is not plausible'),
    fm: pos('fm').max(100, 'fm above 100 N/mm² is not plausible').optional(),
    mortar: z.enum(['general', 'thin-layer'], { error: "Mortar must be 'general' or 'thin-layer'" }),
    K: between('K', 0.1, 1.5),
  })
  .refine((v) => v.mortar !== 'general' || v.fm !== undefined, { message: 'fm is needed for general-purpose mortar', path: ['fm'] })
export type CharacteristicStrengthInputParsed = z.infer<typeof characteristicStrengthInput>

export const verticalResistanceInput = z
  .object({
    fk: pos('fk').max(50, 'fk above 50 N/mm² is not plausible'),
    gammaM: between('γM', 1, 5),
    t_mm: pos('Wall thickness').max(1000, 'Wall thickness above 1000 mm is not plausible'),
    tef_mm: pos('Effective thickness').max(1000, 'Effective thickness above 1000 mm is not plausible').optional(),
    h_m: pos('Storey height').max(20, 'Storey height above 20 m is not plausible'),
    rho: between('ρn', 0.1, 2),
    topEccentricity_mm: num('Top eccentricity').optional(),
    bottomEccentricity_mm: num('Bottom eccentricity').optional(),
    midEccentricity_mm: num('Mid-height eccentricity').optional(),
    creepCoefficient: between('Creep coefficient', 0, 5).optional(),
    elasticModulusFactor: between('KE', 100, 5000).optional(),
    method: z.enum(['annex-g', 'simplified'], { error: "Method must be 'annex-g' or 'simplified'" }),
    buildingHeight_m: pos('Building height').optional(),
    floorSpan_m: between('Floor span', 0, 100).optional(),
    imposedLoad_kNm2: between('Imposed load', 0, 100).optional(),
    topStorey: z.boolean().optional(),
  })
  .refine((v) => v.method !== 'annex-g' || v.topEccentricity_mm !== undefined, {
    message: 'Top eccentricity is needed for the Annex G method',
    path: ['topEccentricity_mm'],
  })
  .refine((v) => v.method !== 'annex-g' || v.bottomEccentricity_mm !== undefined, {
    message: 'Bottom eccentricity is needed for the Annex G method',
    path: ['bottomEccentricity_mm'],
  })
  .refine((v) => v.method !== 'simplified' || v.buildingHeight_m !== undefined, {
    message: 'Building height is needed for the simplified method',
    path: ['buildingHeight_m'],
  })
  .refine((v) => v.method !== 'simplified' || v.floorSpan_m !== undefined, {
    message: 'Floor span is needed for the simplified method',
    path: ['floorSpan_m'],
  })
export type VerticalResistanceInputParsed = z.infer<typeof verticalResistanceInput>

// ---- quantities ------------------------------------------------------------------------------------------------

const joint = (label: string) => between(label, 0, 30)

export const blocksPerM2Input = z.object({
  unitLength_mm: pos('Unit length'),
  unitHeight_mm: pos('Unit height'),
  joint_mm: joint('Joint thickness'),
})
export type BlocksPerM2InputParsed = z.infer<typeof blocksPerM2Input>

const perpends = z.enum(['filled', 'unfilled'], { error: "Perpends must be 'filled' or 'unfilled'" })

export const mortarPerM2Input = blocksPerM2Input.extend({
  wallThickness_mm: pos('Wall thickness'),
  perpends: perpends.optional(),
})
export type MortarPerM2InputParsed = z.infer<typeof mortarPerM2Input>

export const wallSystemInput = z.object({
  block: z.object({
    length_mm: pos('Unit length'),
    height_mm: pos('Unit height'),
    thickness_mm: pos('Unit thickness'),
    joint_mm: joint('Joint thickness').optional(),
    perpends: perpends.optional(),
  }),
  thinLayerMortar: z.object({ bagKg: pos('Mortar bag mass').optional(), litresPerBag: pos('Litres per mortar bag').optional() }).optional(),
  starterCourse: z
    .object({
      bedThickness_mm: pos('Starter bed thickness').optional(),
      litresPerBag: pos('Litres per starter-mortar bag').optional(),
      bagKg: pos('Starter-mortar bag mass').optional(),
    })
    .optional(),
  insulation: z
    .object({ boardLength_mm: pos('Board length').optional(), boardHeight_mm: pos('Board height').optional(), thickness_mm: pos('Board thickness').optional() })
    .optional(),
  adhesive: z.object({ kgPerM2: pos('Adhesive kg/m²').optional(), bagKg: pos('Adhesive bag mass').optional() }).optional(),
  anchors: z.object({ minimumPerM2: between('Minimum anchors per m²', 0, 100).optional() }).optional(),
  mesh: z.object({ rollWidth_m: pos('Mesh roll width').optional(), lap_mm: between('Mesh lap', 0, 500).optional() }).optional(),
  diagonalPatches: z.object({ perOpening: between('Patches per opening', 0, 20).optional() }).optional(),
  baseCoat: z.object({ kgPerM2: pos('Base coat kg/m²').optional(), bagKg: pos('Base coat bag mass').optional() }).optional(),
  primer: z.object({ kgPerM2: pos('Primer kg/m²').optional() }).optional(),
  finish: z.object({ kgPerM2: pos('Finish kg/m²').optional() }).optional(),
})

export const wallQuantitiesInput = z
  .object({
    area_m2: pos('Wall area'),
    openings_m2: nonNeg('Openings area').optional(),
    baseLength_m: pos('Base length'),
    openingsCount: z.number({ error: 'Number of openings must be a number' }).int('Number of openings must be whole').min(0).optional(),
    openingsPerimeter_m: nonNeg('Openings perimeter').optional(),
    openingHeads_m: nonNeg('Opening heads length').optional(),
    externalCorners_m: nonNeg('External corners length').optional(),
    system: wallSystemInput,
    anchorsPerM2: between('Anchors per m²', 0, 100).optional(),
    anchorCount: nonNeg('Anchor count').optional(),
    waste: z.partialRecord(z.enum(QUANTITY_ITEMS), between('Waste allowance', 0, 100)).optional(),
  })
  .refine((v) => (v.openings_m2 ?? 0) < v.area_m2, { message: 'Openings must be smaller than the wall area', path: ['openings_m2'] })
export type WallQuantitiesInputParsed = z.infer<typeof wallQuantitiesInput>

// ---- programme -------------------------------------------------------------------------------------------------

export const buildProgrammeInput = z.object({
  area_m2: pos('Wall area'),
  storeys: z.number({ error: 'Storeys must be a number' }).int('Storeys must be whole').min(1).max(100),
  gangs: z.number({ error: 'Gangs must be a number' }).int('Gangs must be whole').min(1).max(100),
  assumptions: z
    .object({
      storeyHeight_m: pos('Storey height').optional(),
      thinJointUnitHeight_mm: pos('Thin-joint unit height').optional(),
      thinJointJoint_mm: joint('Thin-layer joint').optional(),
      cavityUnitHeight_mm: pos('Cavity unit height').optional(),
      cavityJoint_mm: joint('Conventional joint').optional(),
      thinJointRate_m2PerGangDay: pos('Thin-joint laying rate').optional(),
      cavityLeafRate_m2PerGangDay: pos('Cavity leaf laying rate').optional(),
      thinJointHeightPerDay_m: pos('Thin-joint height per day').optional(),
      conventionalHeightPerDay_m: pos('Conventional height per day').optional(),
    })
    .optional(),
})
export type BuildProgrammeInputParsed = z.infer<typeof buildProgrammeInput>

// ---- quotation -------------------------------------------------------------------------------------------------

export const priceBookItemInput = z.object({
  code: text('Code', 60),
  description: text('Description'),
  unit: text('Unit', 20),
  unitPrice: cents('Unit price'),
  packSize: pos('Pack size').optional(),
})

export const labourRateInput = z.object({
  code: text('Code', 60),
  description: text('Description'),
  unit: text('Unit', 20),
  unitPrice: cents('Labour rate'),
  appliesTo: z.enum(['lay', 'system'], { error: "Labour applies to 'lay' or 'system'" }),
})

export const quoteQuantityLineInput = z.object({
  code: text('Code', 60),
  quantity: between('Quantity', 0, 1e9),
  unit: text('Unit', 20).optional(),
  description: text('Description').optional(),
})

export const quoteInput = z.object({
  lines: z.array(quoteQuantityLineInput).max(500),
  priceBook: z.array(priceBookItemInput).max(5000),
  labourRates: z.array(labourRateInput).max(500).optional(),
  labour: z.array(quoteQuantityLineInput).max(500).optional(),
  deliveryCharge: cents('Delivery charge').optional(),
  scope: z.enum(['supply', 'supply-and-lay', 'full-system'], { error: 'Choose supply, supply and lay, or the full system' }),
  discountPercent: between('Discount', 0, 100).optional(),
  vatRatePercent: between('VAT rate', 0, 100),
})
export type QuoteInputParsed = z.infer<typeof quoteInput>

// ---- compile-time agreement with the engine's input types -----------------------------------------------------

/** Fails to compile when a parsed schema value is not a valid engine input. */
type Agrees<Parsed extends Input, Input> = [Parsed, Input]
export type Schemas2AgreeWithEngine = [
  Agrees<PeakVelocityPressureInputParsed, PeakVelocityPressureInput>,
  Agrees<WallPressureCoefficientsInputParsed, WallPressureCoefficientsInput>,
  Agrees<AnchorsPerM2InputParsed, AnchorsPerM2Input>,
  Agrees<AnchorLayoutInputParsed, AnchorLayoutInput>,
  Agrees<NormalisedStrengthInputParsed, NormalisedStrengthInput>,
  Agrees<CharacteristicStrengthInputParsed, CharacteristicStrengthInput>,
  Agrees<VerticalResistanceInputParsed, VerticalResistanceInput>,
  Agrees<BlocksPerM2InputParsed, BlocksPerM2Input>,
  Agrees<MortarPerM2InputParsed, MortarPerM2Input>,
  Agrees<WallQuantitiesInputParsed, WallQuantitiesInput>,
  Agrees<BuildProgrammeInputParsed, BuildProgrammeInput>,
  Agrees<QuoteInputParsed, QuoteInput>,
]
