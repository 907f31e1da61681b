/**
 * Compressive strength and vertical resistance of unreinforced masonry walls — EN 772-1 (units),
 * EN 1996-1-1 (general rules, Annex G) and EN 1996-3 (simplified method).
 *
 * The standards' texts are licensed; their tabulated values here are quoted from memory and labelled so.
 * Structural results are indicative and always carry MASONRY_ENGINEER_CAUTION.
 */
import { CalcInputError, requireFinite, requirePositive, requireRange } from './errors'

/** Shown with every structural result. */
export const MASONRY_ENGINEER_CAUTION =
  'Indicative calculation only. A chartered structural engineer must confirm the wall design under the local ' +
  'building regulations and the National Annex that applies; this result is not a certificate of compliance.'

// ---------------------------------------------------------------------------------------------------------------
// EN 772-1: normalised compressive strength
// ---------------------------------------------------------------------------------------------------------------

/** Specimen heights (mm) of the shape-factor table; the last row stands for 250 mm and over. */
export const SHAPE_FACTOR_HEIGHTS_MM = [40, 50, 65, 100, 150, 200, 250] as const
/** Least horizontal dimensions (mm) of the shape-factor table; the last column stands for 250 mm and over. */
export const SHAPE_FACTOR_WIDTHS_MM = [50, 100, 150, 200, 250] as const

/**
 * Shape factor δ by specimen height (rows) and least horizontal dimension (columns); null where the table
 * has no value. Values recalled from EN 772-1 Annex A, Table A.1.
 */
export const SHAPE_FACTOR_TABLE: ReadonlyArray<ReadonlyArray<number | null>> = [
  [0.8, 0.7, null, null, null], // 40
  [0.85, 0.75, 0.7, null, null], // 50
  [0.95, 0.85, 0.75, 0.7, 0.65], // 65
  [1.15, 1.0, 0.9, 0.8, 0.75], // 100
  [1.3, 1.2, 1.1, 1.0, 0.95], // 150
  [1.45, 1.35, 1.25, 1.15, 1.1], // 200
  [1.55, 1.45, 1.35, 1.25, 1.15], // ≥ 250
]

export type UnitConditioning = 'air-dry' | 'oven-dry' | 'moisture-6pc' | 'water-soaked'

/**
 * Factor converting a strength measured after the given conditioning to the air-dry reference
 * (values recalled from EN 772-1 §7.3 and Annex A: air-dry and 6 % moisture 1.0, oven-dry 0.8, immersion 1.2).
 */
export const CONDITIONING_FACTORS: Readonly<Record<UnitConditioning, number>> = {
  'air-dry': 1.0,
  'moisture-6pc': 1.0,
  'oven-dry': 0.8,
  'water-soaked': 1.2,
}

function bracket(values: readonly number[], x: number): [number, number, number] {
  if (x >= values[values.length - 1]!) return [values.length - 1, values.length - 1, 0]
  for (let i = 0; i < values.length - 1; i++) {
    const lo = values[i]!
    const hi = values[i + 1]!
    if (x >= lo && x <= hi) return [i, i + 1, (x - lo) / (hi - lo)]
  }
  /* c8 ignore next */
  throw new Error('unreachable')
}

/**
 * Shape factor δ for a specimen, interpolated linearly in both directions as EN 772-1 Annex A permits.
 * Sizes are after any surface preparation; sizes above 250 mm take the 250 mm values.
 */
export function shapeFactor(unitHeight_mm: number, unitWidth_mm: number): number {
  const h = requirePositive('unitHeight_mm', unitHeight_mm)
  const w = requirePositive('unitWidth_mm', unitWidth_mm)
  if (h < SHAPE_FACTOR_HEIGHTS_MM[0]) {
    throw new CalcInputError('unitHeight_mm', `unitHeight_mm must be at least 40 mm for the EN 772-1 shape-factor table (got ${h})`)
  }
  if (w < SHAPE_FACTOR_WIDTHS_MM[0]) {
    throw new CalcInputError('unitWidth_mm', `unitWidth_mm must be at least 50 mm for the EN 772-1 shape-factor table (got ${w})`)
  }
  const [r0, r1, tr] = bracket(SHAPE_FACTOR_HEIGHTS_MM, h)
  const [c0, c1, tc] = bracket(SHAPE_FACTOR_WIDTHS_MM, w)
  const corners = [SHAPE_FACTOR_TABLE[r0]![c0], SHAPE_FACTOR_TABLE[r0]![c1], SHAPE_FACTOR_TABLE[r1]![c0], SHAPE_FACTOR_TABLE[r1]![c1]]
  // A corner is only needed when its interpolation weight is non-zero.
  const weights = [(1 - tr) * (1 - tc), (1 - tr) * tc, tr * (1 - tc), tr * tc]
  let delta = 0
  for (let i = 0; i < 4; i++) {
    if (weights[i]! === 0) continue
    const v = corners[i]
    if (v === null || v === undefined) {
      throw new CalcInputError(
        'unitWidth_mm',
        `The EN 772-1 shape-factor table has no value for a ${h} mm high specimen ${w} mm wide; test a taller specimen`,
      )
    }
    delta += weights[i]! * v
  }
  return delta
}

export interface NormalisedStrengthInput {
  /** Mean compressive strength of the specimens as tested (N/mm²). */
  meanStrength: number
  /** Specimen height as tested (mm). */
  unitHeight_mm: number
  /** Least horizontal dimension of the specimen (mm). */
  unitWidth_mm: number
  conditioning: UnitConditioning
}

export interface NormalisedStrengthResult {
  /** Normalised mean compressive strength fb (N/mm²). */
  fb: number
  shapeFactor: number
  conditioningFactor: number
  /** Mean strength converted to air-dry before the shape factor. */
  airDryStrength: number
}

/** Normalised compressive strength fb = δ × (conditioning factor) × mean strength — EN 772-1 Annex A. */
export function normalisedStrength(input: NormalisedStrengthInput): NormalisedStrengthResult {
  const mean = requirePositive('meanStrength', input.meanStrength)
  const factor = CONDITIONING_FACTORS[input.conditioning as UnitConditioning]
  if (factor === undefined) {
    throw new CalcInputError(
      'conditioning',
      `conditioning must be one of ${Object.keys(CONDITIONING_FACTORS).join(', ')} (got ${String(input.conditioning)})`,
    )
  }
  const delta = shapeFactor(input.unitHeight_mm, input.unitWidth_mm)
  const airDry = mean * factor
  return { fb: airDry * delta, shapeFactor: delta, conditioningFactor: factor, airDryStrength: airDry }
}

// ---------------------------------------------------------------------------------------------------------------
// National Annex presets for K and γM
// ---------------------------------------------------------------------------------------------------------------

export type MasonryMortar = 'general' | 'thin-layer'
export type MasonryUnitMaterial = 'aggregate-concrete' | 'autoclaved-aerated-concrete' | 'calcium-silicate' | 'clay'

export interface KPresetValue {
  unit: MasonryUnitMaterial
  group: 1 | 2
  mortar: MasonryMortar
  /** Extra condition the value depends on, spelled out for the user. */
  condition?: string
  /** Doubt about the recalled value, shown beside it. */
  caveat?: string
  K: number
}

export interface GammaMPresetValue {
  /** Masonry unit category (EN 771 series): I (declared strength with ≤ 5 % probability of falling short) or II. */
  unitCategory: 'I' | 'II'
  /** Class of execution control as the National Annex defines it. */
  executionClass: string
  /** Mortar specification where the annex distinguishes it. */
  mortarSpec?: 'designed' | 'prescribed'
  gammaM: number
}

export interface MasonryAnnexPreset {
  id: string
  label: string
  /** 'recommended' = the Eurocode's own recommended values; 'recalled' = a National Annex quoted from memory. */
  status: 'recommended' | 'recalled'
  source: string
  /** Always shown with the preset so nobody mistakes it for a checked copy of the annex. */
  note: string
  K: KPresetValue[]
  gammaM: GammaMPresetValue[]
}

/**
 * Named data sets for K (EN 1996-1-1 Table 3.3) and γM (EN 1996-1-1 §2.4.3). The user picks one and the
 * values are shown beside the result; a National Annex the product does not carry is entered by hand.
 */
export const MASONRY_ANNEX_PRESETS: readonly MasonryAnnexPreset[] = [
  {
    id: 'en1996-recommended',
    label: 'EN 1996-1-1 recommended values (no National Annex)',
    status: 'recommended',
    source: 'value recalled from EN 1996-1-1:2005+A1:2012 Table 3.3 and the Note to §2.4.3(1)',
    note: 'Recommended values of the Eurocode, recalled; a National Annex may replace every one of them.',
    K: [
      { unit: 'aggregate-concrete', group: 1, mortar: 'general', K: 0.55 },
      { unit: 'aggregate-concrete', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'aggregate-concrete', group: 2, mortar: 'general', K: 0.52 },
      {
        unit: 'aggregate-concrete',
        group: 2,
        mortar: 'thin-layer',
        caveat: 'recalled as 0.76; another reference lists 0.65 — check the standard before relying on it',
        K: 0.76,
      },
      { unit: 'autoclaved-aerated-concrete', group: 1, mortar: 'general', K: 0.55 },
      { unit: 'autoclaved-aerated-concrete', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'calcium-silicate', group: 1, mortar: 'general', K: 0.55 },
      { unit: 'calcium-silicate', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'calcium-silicate', group: 2, mortar: 'general', K: 0.45 },
      { unit: 'calcium-silicate', group: 2, mortar: 'thin-layer', K: 0.65 },
      { unit: 'clay', group: 1, mortar: 'general', K: 0.55 },
      { unit: 'clay', group: 1, mortar: 'thin-layer', K: 0.75 },
      { unit: 'clay', group: 2, mortar: 'general', K: 0.45 },
      { unit: 'clay', group: 2, mortar: 'thin-layer', K: 0.7 },
    ],
    gammaM: [
      { unitCategory: 'I', executionClass: '1', mortarSpec: 'designed', gammaM: 1.5 },
      { unitCategory: 'I', executionClass: '2', mortarSpec: 'designed', gammaM: 1.7 },
      { unitCategory: 'I', executionClass: '3', mortarSpec: 'designed', gammaM: 2.0 },
      { unitCategory: 'I', executionClass: '4', mortarSpec: 'designed', gammaM: 2.2 },
      { unitCategory: 'I', executionClass: '5', mortarSpec: 'designed', gammaM: 2.5 },
      { unitCategory: 'I', executionClass: '1', mortarSpec: 'prescribed', gammaM: 1.7 },
      { unitCategory: 'I', executionClass: '2', mortarSpec: 'prescribed', gammaM: 2.0 },
      { unitCategory: 'I', executionClass: '3', mortarSpec: 'prescribed', gammaM: 2.2 },
      { unitCategory: 'I', executionClass: '4', mortarSpec: 'prescribed', gammaM: 2.5 },
      { unitCategory: 'I', executionClass: '5', mortarSpec: 'prescribed', gammaM: 2.7 },
      { unitCategory: 'II', executionClass: '1', gammaM: 2.0 },
      { unitCategory: 'II', executionClass: '2', gammaM: 2.2 },
      { unitCategory: 'II', executionClass: '3', gammaM: 2.5 },
      { unitCategory: 'II', executionClass: '4', gammaM: 2.7 },
      { unitCategory: 'II', executionClass: '5', gammaM: 3.0 },
    ],
  },
  {
    id: 'uk-na-recalled',
    label: 'UK National Annex to BS EN 1996-1-1 (recalled — verify)',
    status: 'recalled',
    source: 'value recalled from the UK National Annex to BS EN 1996-1-1, Tables NA.1 and NA.4',
    note: 'Recalled from memory, not read from the annex: the engineer checks each value against the current annex.',
    K: [
      { unit: 'aggregate-concrete', group: 1, mortar: 'general', K: 0.75 },
      { unit: 'aggregate-concrete', group: 1, mortar: 'general', condition: 'units laid flat', K: 0.5 },
      { unit: 'aggregate-concrete', group: 2, mortar: 'general', K: 0.7 },
      { unit: 'aggregate-concrete', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'autoclaved-aerated-concrete', group: 1, mortar: 'general', K: 0.75 },
      { unit: 'autoclaved-aerated-concrete', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'calcium-silicate', group: 1, mortar: 'general', K: 0.8 },
      { unit: 'calcium-silicate', group: 2, mortar: 'general', K: 0.7 },
      { unit: 'calcium-silicate', group: 1, mortar: 'thin-layer', K: 0.8 },
      { unit: 'clay', group: 1, mortar: 'general', K: 0.5 },
      { unit: 'clay', group: 2, mortar: 'general', K: 0.4 },
      { unit: 'clay', group: 1, mortar: 'thin-layer', K: 0.75 },
    ],
    gammaM: [
      { unitCategory: 'I', executionClass: '1', gammaM: 2.3 },
      { unitCategory: 'I', executionClass: '2', gammaM: 2.7 },
      { unitCategory: 'II', executionClass: '1', gammaM: 2.6 },
      { unitCategory: 'II', executionClass: '2', gammaM: 3.0 },
    ],
  },
]

function findPreset(presetId: string): MasonryAnnexPreset {
  const preset = MASONRY_ANNEX_PRESETS.find((p) => p.id === presetId)
  if (!preset) {
    throw new CalcInputError('presetId', `Unknown National Annex preset "${presetId}"; choose one of ${MASONRY_ANNEX_PRESETS.map((p) => p.id).join(', ')}`)
  }
  return preset
}

/** K from a named preset; the first entry without a condition wins unless `condition` asks for one. */
export function masonryKFromPreset(
  presetId: string,
  unit: MasonryUnitMaterial,
  group: 1 | 2,
  mortar: MasonryMortar,
  condition?: string,
): KPresetValue & { presetId: string; source: string } {
  const preset = findPreset(presetId)
  const match = preset.K.find(
    (k) => k.unit === unit && k.group === group && k.mortar === mortar && (condition === undefined ? !k.condition : k.condition === condition),
  )
  if (!match) {
    throw new CalcInputError('K', `Preset "${presetId}" holds no K for ${unit} Group ${group} units in ${mortar} mortar; enter K by hand`)
  }
  return { ...match, presetId, source: preset.source }
}

/** γM from a named preset. */
export function masonryGammaMFromPreset(
  presetId: string,
  unitCategory: 'I' | 'II',
  executionClass: string,
  mortarSpec?: 'designed' | 'prescribed',
): GammaMPresetValue & { presetId: string; source: string } {
  const preset = findPreset(presetId)
  const match = preset.gammaM.find(
    (g) =>
      g.unitCategory === unitCategory &&
      g.executionClass === executionClass &&
      (g.mortarSpec === undefined || mortarSpec === undefined || g.mortarSpec === mortarSpec),
  )
  if (!match) {
    throw new CalcInputError('gammaM', `Preset "${presetId}" holds no γM for category ${unitCategory} units, execution class ${executionClass}; enter γM by hand`)
  }
  return { ...match, presetId, source: preset.source }
}

// ---------------------------------------------------------------------------------------------------------------
// EN 1996-1-1 §3.6.1.2: characteristic compressive strength
// ---------------------------------------------------------------------------------------------------------------

export interface CharacteristicStrengthInput {
  /** Normalised mean compressive strength of the units (N/mm²). */
  fb: number
  /** Mortar compressive strength (N/mm²); needed for general-purpose mortar. */
  fm?: number
  mortar: MasonryMortar
  /** Constant K from the chosen National Annex preset (shown, never hidden). */
  K: number
}

export interface CharacteristicStrengthResult {
  /** Characteristic compressive strength fk (N/mm²). */
  fk: number
  /** fb and fm as used, after the caps of §3.6.1.2(2)/(3). */
  fbUsed: number
  fmUsed: number | null
  K: number
  formula: string
  notes: string[]
}

/**
 * Characteristic compressive strength of masonry — EN 1996-1-1 §3.6.1.2: fk = K·fb^0.7·fm^0.3 with
 * general-purpose mortar (Expression 3.2), fk = K·fb^0.85 with thin-layer mortar in bed joints of 0.5–3 mm
 * for Group 1 and 2 aggregate-concrete, calcium-silicate and aerated units (Expression 3.3).
 * fb is capped at 75 N/mm² (general) or 50 N/mm² (thin-layer) and fm at min(20, 2·fb), as the clause requires.
 */
export function characteristicStrength(input: CharacteristicStrengthInput): CharacteristicStrengthResult {
  const fb = requirePositive('fb', input.fb)
  const K = requireRange('K', input.K, 0.1, 1.5)
  const notes: string[] = []
  if (input.mortar === 'general') {
    if (input.fm === undefined) throw new CalcInputError('fm', 'fm (mortar strength) is needed for general-purpose mortar')
    const fm = requirePositive('fm', input.fm)
    const fbUsed = Math.min(fb, 75)
    if (fbUsed < fb) notes.push('fb capped at 75 N/mm² for general-purpose mortar.')
    const fmCap = Math.min(20, 2 * fbUsed)
    const fmUsed = Math.min(fm, fmCap)
    if (fmUsed < fm) notes.push(`fm capped at ${fmCap} N/mm² (the lesser of 20 N/mm² and 2·fb).`)
    return { fk: K * Math.pow(fbUsed, 0.7) * Math.pow(fmUsed, 0.3), fbUsed, fmUsed, K, formula: 'fk = K·fb^0.7·fm^0.3', notes }
  }
  if (input.mortar === 'thin-layer') {
    const fbUsed = Math.min(fb, 50)
    if (fbUsed < fb) notes.push('fb capped at 50 N/mm² for thin-layer mortar.')
    notes.push('Thin-layer expression applies to bed joints of 0.5–3 mm.')
    return { fk: K * Math.pow(fbUsed, 0.85), fbUsed, fmUsed: null, K, formula: 'fk = K·fb^0.85', notes }
  }
  throw new CalcInputError('mortar', `mortar must be 'general' or 'thin-layer' (got ${String(input.mortar)})`)
}

// ---------------------------------------------------------------------------------------------------------------
// Vertical resistance of a single-leaf wall
// ---------------------------------------------------------------------------------------------------------------

export interface VerticalResistanceInput {
  /** Characteristic compressive strength fk (N/mm²). */
  fk: number
  /** Partial factor γM from the chosen preset. */
  gammaM: number
  /** Wall thickness t (mm). */
  t_mm: number
  /** Effective thickness tef (mm); defaults to t for a single leaf (EN 1996-1-1 §5.5.1.3). */
  tef_mm?: number
  /** Clear storey height h (m). */
  h_m: number
  /** Reduction factor ρn for the edge restraint (EN 1996-1-1 §5.5.1.2), e.g. 0.75 for a wall restrained by concrete floors top and bottom. */
  rho: number
  /**
   * Eccentricities of the load, Mi/Ni, at the top and bottom of the wall (mm), signed: the same sign means single
   * curvature. Include any eccentricity from horizontal loads (ehe) in them. Required by 'annex-g'; the
   * simplified method covers eccentricity through its limits and ignores them.
   */
  topEccentricity_mm?: number
  bottomEccentricity_mm?: number
  /**
   * Eccentricity Mm/Nm at mid-height (mm) including ehm. When omitted, the moment is taken as linear between top
   * and bottom (no lateral load), i.e. the average of the two signed values.
   */
  midEccentricity_mm?: number
  /** Final creep coefficient φ∞; recalled from EN 1996-1-1 Table 3.8: aggregate concrete 1.0–2.0. Default 1.5. */
  creepCoefficient?: number
  /** KE in E = KE·fk; recommended 1000 (EN 1996-1-1 §3.7.2). */
  elasticModulusFactor?: number
  method: 'annex-g' | 'simplified'
  /** Simplified method: building height above ground (m). */
  buildingHeight_m?: number
  /** Simplified method: clear span of the floors bearing on the wall (m). */
  floorSpan_m?: number
  /** Simplified method: characteristic imposed floor load (kN/m²). */
  imposedLoad_kNm2?: number
  /** Simplified method: the wall carries the top floor or roof only (Φs capped, recalled EN 1996-3 §4.2.2.3). */
  topStorey?: boolean
}

export interface VerticalResistanceResult {
  method: 'annex-g' | 'simplified'
  /** Design vertical resistance per metre run (kN/m). */
  NRd_kNm: number
  /** Design compressive strength fd = fk/γM (N/mm²). */
  fd: number
  /** Capacity reduction factors; with the simplified method all three equal Φs. */
  phiTop: number
  phiMid: number
  phiBottom: number
  /** The factor that governs, min of the three. */
  phi: number
  governingSection: 'top' | 'mid' | 'bottom'
  hef_m: number
  tef_mm: number
  /** Slenderness hef/tef. */
  slenderness: number
  /** Eccentricities used (mm). */
  eccentricities: { einit: number; eTop: number; eBottom: number; em: number; ek: number; emk: number } | null
  /** Checks that fail; empty when nothing failed. */
  failedChecks: string[]
  notes: string[]
  caution: string
}

const MAX_SLENDERNESS = 27
const SIMPLIFIED_LIMITS = { buildingHeight_m: 20, storeyHeight_m: 3.2, slenderness: 21, floorSpan_m: 7, imposedLoad_kNm2: 5 }

/**
 * Design vertical resistance of a single-leaf wall per metre, NRd = Φ·t·fd.
 *
 * 'annex-g': EN 1996-1-1 §6.1.2: Φi = 1 − 2ei/t at top and bottom (ei ≥ 0.05t, §6.1.2.2 Expr. 6.4–6.5) and
 * Φm = A1·exp(−u²/2) at mid-height (Annex G), with einit = hef/450 (§5.5.1.1) and the creep eccentricity
 * ek = 0.002·φ∞·(hef/tef)·√(t·em), taken as zero up to hef/tef = 15 (Expr. 6.8).
 * 'simplified': EN 1996-3 §4.2.2: Φs = 0.85 − 0.0011·(hef/tef)², with the method's limits checked.
 */
export function verticalResistance(input: VerticalResistanceInput): VerticalResistanceResult {
  const fk = requirePositive('fk', input.fk)
  const gammaM = requireRange('gammaM', input.gammaM, 1, 5)
  const t = requirePositive('t_mm', input.t_mm)
  const tef = input.tef_mm === undefined ? t : requirePositive('tef_mm', input.tef_mm)
  const h = requirePositive('h_m', input.h_m)
  const rho = requireRange('rho', input.rho, 0.1, 2)
  const method = input.method
  if (method !== 'annex-g' && method !== 'simplified') {
    throw new CalcInputError('method', `method must be 'annex-g' or 'simplified' (got ${String(method)})`)
  }
  const fd = fk / gammaM
  const hef_m = rho * h
  const slenderness = (hef_m * 1000) / tef
  const failedChecks: string[] = []
  const notes: string[] = []
  if (slenderness > MAX_SLENDERNESS) {
    failedChecks.push(`Slenderness hef/tef = ${slenderness.toFixed(1)} exceeds ${MAX_SLENDERNESS} (EN 1996-1-1 §5.5.1.4).`)
  }

  if (method === 'simplified') {
    const buildingHeight = input.buildingHeight_m
    const span = input.floorSpan_m
    if (buildingHeight === undefined) throw new CalcInputError('buildingHeight_m', 'buildingHeight_m is needed for the simplified method')
    if (span === undefined) throw new CalcInputError('floorSpan_m', 'floorSpan_m is needed for the simplified method')
    requirePositive('buildingHeight_m', buildingHeight)
    requireRange('floorSpan_m', span, 0, 100)
    const L = SIMPLIFIED_LIMITS
    if (buildingHeight > L.buildingHeight_m) failedChecks.push(`Building height ${buildingHeight} m exceeds ${L.buildingHeight_m} m, the simplified method's limit (EN 1996-3 §4.2.1.1).`)
    if (h > L.storeyHeight_m) failedChecks.push(`Clear storey height ${h} m exceeds ${L.storeyHeight_m} m, the simplified method's limit (EN 1996-3 §4.2.1.1).`)
    if (slenderness > L.slenderness) failedChecks.push(`Slenderness ${slenderness.toFixed(1)} exceeds ${L.slenderness}, the simplified method's limit (EN 1996-3 §4.2.1.1).`)
    if (span > L.floorSpan_m) failedChecks.push(`Floor span ${span} m exceeds ${L.floorSpan_m} m, the simplified method's limit (EN 1996-3 §4.2.1.1).`)
    if (input.imposedLoad_kNm2 !== undefined) {
      const q = requireRange('imposedLoad_kNm2', input.imposedLoad_kNm2, 0, 100)
      if (q > L.imposedLoad_kNm2) failedChecks.push(`Imposed load ${q} kN/m² exceeds ${L.imposedLoad_kNm2} kN/m², the simplified method's limit (EN 1996-3 §4.2.1.1).`)
    }
    notes.push('Only the main limits of EN 1996-3 §4.2.1.1 are checked here; the engineer checks the rest (wall thickness, lateral load, bearing).')
    let phiS = 0.85 - 0.0011 * slenderness * slenderness
    // Floor span reduction, recalled from EN 1996-3 §4.2.2.3; it only ever lowers Φs.
    const spanCap = 1.3 - span / 8
    if (spanCap < phiS) {
      phiS = spanCap
      notes.push('Φs limited to 1.3 − lf,ef/8 for the floor span (recalled from EN 1996-3 §4.2.2.3).')
    }
    if (input.topStorey) {
      if (phiS > 0.4) notes.push('Φs limited to 0.4 for a wall carrying only the top floor or roof (recalled from EN 1996-3 §4.2.2.3).')
      phiS = Math.min(phiS, 0.4)
    }
    if (phiS <= 0) {
      failedChecks.push('Φs is zero or below: the wall is too slender for the simplified method.')
      phiS = 0
    }
    return {
      method,
      NRd_kNm: phiS * t * fd,
      fd,
      phiTop: phiS,
      phiMid: phiS,
      phiBottom: phiS,
      phi: phiS,
      governingSection: 'mid',
      hef_m,
      tef_mm: tef,
      slenderness,
      eccentricities: null,
      failedChecks,
      notes,
      caution: MASONRY_ENGINEER_CAUTION,
    }
  }

  const eTopLoad = requireFinite('topEccentricity_mm', input.topEccentricity_mm)
  const eBottomLoad = requireFinite('bottomEccentricity_mm', input.bottomEccentricity_mm)
  const eMidLoad =
    input.midEccentricity_mm === undefined ? (eTopLoad + eBottomLoad) / 2 : requireFinite('midEccentricity_mm', input.midEccentricity_mm)
  if (input.midEccentricity_mm === undefined) notes.push('Mid-height eccentricity taken as the average of top and bottom (linear moment, no lateral load).')
  const creep = input.creepCoefficient === undefined ? 1.5 : requireRange('creepCoefficient', input.creepCoefficient, 0, 5)
  const KE = input.elasticModulusFactor === undefined ? 1000 : requireRange('elasticModulusFactor', input.elasticModulusFactor, 100, 5000)

  const hef_mm = hef_m * 1000
  const einit = hef_mm / 450
  const eMin = 0.05 * t
  // einit always acts in the unfavourable direction, so it adds to the magnitude.
  const eTop = Math.max(Math.abs(eTopLoad) + einit, eMin)
  const eBottom = Math.max(Math.abs(eBottomLoad) + einit, eMin)
  const em = Math.abs(eMidLoad) + einit
  const ek = slenderness <= 15 ? 0 : 0.002 * creep * slenderness * Math.sqrt(t * em)
  const emk = Math.max(em + ek, eMin)

  const phiEnd = (e: number) => 1 - (2 * e) / t
  let phiTop = phiEnd(eTop)
  let phiBottom = phiEnd(eBottom)
  const lambda = slenderness * Math.sqrt(1 / KE) // (hef/tef)·√(fk/E) with E = KE·fk
  const A1 = 1 - (2 * emk) / t
  const u = (lambda - 0.063) / (0.73 - (1.17 * emk) / t)
  let phiMid = A1 > 0 ? A1 * Math.exp((-u * u) / 2) : 0
  if (phiTop <= 0 || phiBottom <= 0 || A1 <= 0) {
    failedChecks.push('The eccentricity reaches half the wall thickness: the section cannot carry the load (Φ ≤ 0).')
  }
  phiTop = Math.max(0, phiTop)
  phiBottom = Math.max(0, phiBottom)
  phiMid = Math.max(0, phiMid)
  const phi = Math.min(phiTop, phiMid, phiBottom)
  const governingSection = phi === phiTop ? 'top' : phi === phiBottom ? 'bottom' : 'mid'
  return {
    method,
    NRd_kNm: phi * t * fd,
    fd,
    phiTop,
    phiMid,
    phiBottom,
    phi,
    governingSection,
    hef_m,
    tef_mm: tef,
    slenderness,
    eccentricities: { einit, eTop, eBottom, em, ek, emk },
    failedChecks,
    notes,
    caution: MASONRY_ENGINEER_CAUTION,
  }
}
