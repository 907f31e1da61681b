/**
 * Wind action on a facade and the insulation anchors that resist it — EN 1991-1-4.
 *
 * Pure functions: no I/O, no framework imports. Every result that sizes a fixing carries
 * WIND_ENGINEER_CAUTION; nothing here is a statement that a design complies with anything.
 */
import { CalcInputError, requireFinite, requirePositive, requireRange } from './errors'

/** Shown with every wind and anchor result. */
export const WIND_ENGINEER_CAUTION =
  'Indicative calculation only. A chartered structural engineer must confirm the wind loads and the anchor design ' +
  'under the local building regulations and the National Annex that applies to the site.'

export type TerrainCategory = '0' | 'I' | 'II' | 'III' | 'IV'

/**
 * Roughness length z0 and minimum height zmin (m) per terrain category — EN 1991-1-4 Table 4.1.
 * zmax is 200 m for every category.
 */
export const TERRAIN_CATEGORIES: Readonly<Record<TerrainCategory, { z0: number; zmin: number; description: string }>> = {
  '0': { z0: 0.003, zmin: 1, description: 'Sea or coastal area exposed to the open sea' },
  I: { z0: 0.01, zmin: 1, description: 'Lakes or flat, horizontal area with negligible vegetation and no obstacles' },
  II: { z0: 0.05, zmin: 2, description: 'Low vegetation such as grass and isolated obstacles at least 20 obstacle heights apart' },
  III: { z0: 0.3, zmin: 5, description: 'Regular cover of vegetation or buildings, or isolated obstacles up to 20 obstacle heights apart' },
  IV: { z0: 1.0, zmin: 10, description: 'At least 15 % of the surface covered with buildings whose average height exceeds 15 m' },
}

/** Reference roughness length of terrain category II (m) — EN 1991-1-4 §4.3.2. */
const Z0_II = 0.05
/** Upper height limit of the logarithmic profile (m) — EN 1991-1-4 §4.3.2. */
const Z_MAX = 200
/** Air density (kg/m³), recommended value — EN 1991-1-4 §4.5 Note 2. */
const AIR_DENSITY = 1.25
/** Turbulence factor kI, recommended value — EN 1991-1-4 §4.4. */
const K_I = 1.0

export interface PeakVelocityPressureInput {
  /** Basic wind velocity vb = cdir·cseason·vb,0 (m/s), from the National Annex map the user reads. */
  vb: number
  /** Reference height ze of the facade or strip (m). Heights below zmin use zmin, as §4.3.2 requires. */
  z: number
  terrain: TerrainCategory
  /** Orography factor co(z); 1.0 unless the site sits on a hill or escarpment (§4.3.3). */
  co?: number
  /** Air density ρ (kg/m³); the National Annex may give another value. */
  rho?: number
}

export interface PeakVelocityPressureResult {
  /** Peak velocity pressure qp(z) in Pa. */
  qp: number
  /** Basic velocity pressure qb = ½ρvb² in Pa. */
  qb: number
  /** Exposure factor ce = qp/qb. */
  ce: number
  kr: number
  cr: number
  /** Mean wind velocity vm(z) in m/s. */
  vm: number
  /** Turbulence intensity Iv(z). */
  Iv: number
  z0: number
  zmin: number
  /** Height actually used in the profile, max(z, zmin). */
  zUsed: number
  caution: string
}

/**
 * Peak velocity pressure qp(z) — EN 1991-1-4 §4.3.2 (Expressions 4.4, 4.5), §4.4 (4.7) and §4.5 (4.8),
 * with the recommended kI = 1 and ρ = 1.25 kg/m³ unless the caller supplies another density.
 */
export function peakVelocityPressure(input: PeakVelocityPressureInput): PeakVelocityPressureResult {
  const vb = requirePositive('vb', input.vb)
  const z = requirePositive('z', input.z)
  if (z > Z_MAX) throw new CalcInputError('z', `z must not exceed ${Z_MAX} m, the top of the EN 1991-1-4 profile (got ${z})`)
  const terrain = TERRAIN_CATEGORIES[input.terrain as TerrainCategory]
  if (!terrain) {
    throw new CalcInputError('terrain', `terrain must be one of 0, I, II, III, IV (got ${String(input.terrain)})`)
  }
  const co = input.co === undefined ? 1 : requirePositive('co', input.co)
  const rho = input.rho === undefined ? AIR_DENSITY : requirePositive('rho', input.rho)

  const { z0, zmin } = terrain
  const zUsed = Math.max(z, zmin)
  const kr = 0.19 * Math.pow(z0 / Z0_II, 0.07)
  const logTerm = Math.log(zUsed / z0)
  const cr = kr * logTerm
  const vm = cr * co * vb
  const Iv = K_I / (co * logTerm)
  const qp = (1 + 7 * Iv) * 0.5 * rho * vm * vm
  const qb = 0.5 * rho * vb * vb
  return { qp, qb, ce: qp / qb, kr, cr, vm, Iv, z0, zmin, zUsed, caution: WIND_ENGINEER_CAUTION }
}

export type WallZone = 'A' | 'B' | 'C' | 'D' | 'E'

/**
 * External pressure coefficients for vertical walls of rectangular-plan buildings, cpe,10 and cpe,1 at
 * h/d = 5, 1 and ≤ 0.25 — EN 1991-1-4 Table 7.1.
 */
export const WALL_CPE_TABLE: ReadonlyArray<{ hOverD: number; cpe10: Record<WallZone, number>; cpe1: Record<WallZone, number> }> = [
  {
    hOverD: 5,
    cpe10: { A: -1.2, B: -0.8, C: -0.5, D: 0.8, E: -0.7 },
    cpe1: { A: -1.4, B: -1.1, C: -0.5, D: 1.0, E: -0.7 },
  },
  {
    hOverD: 1,
    cpe10: { A: -1.2, B: -0.8, C: -0.5, D: 0.8, E: -0.5 },
    cpe1: { A: -1.4, B: -1.1, C: -0.5, D: 1.0, E: -0.5 },
  },
  {
    hOverD: 0.25,
    cpe10: { A: -1.2, B: -0.8, C: -0.5, D: 0.7, E: -0.3 },
    cpe1: { A: -1.4, B: -1.1, C: -0.5, D: 1.0, E: -0.3 },
  },
]

export interface WallPressureCoefficientsInput {
  /** Crosswind dimension b (m): the building's width across the wind. */
  b: number
  /** In-wind dimension d (m): the building's depth along the wind, i.e. the length of the side walls. */
  d: number
  /** Building height h (m). */
  h: number
  /** Loaded area of the element being designed (m²); for an ETICS anchor, its tributary area (often < 1 m²). */
  loadedArea_m2: number
}

export interface WallZoneResult {
  zone: WallZone
  /** Which face the zone lies on: side walls parallel to the wind, windward face, leeward face. */
  face: 'side' | 'windward' | 'leeward'
  /** Width of the zone along its face (m). */
  width_m: number
  /** Distance from the windward corner where the zone starts (side zones) or 0 (windward/leeward faces). */
  start_m: number
  cpe10: number
  cpe1: number
  /** cpe for the loaded area. */
  cpe: number
}

export interface WallPressureCoefficientsResult {
  /** e = min(b, 2h) (m). */
  e: number
  hOverD: number
  /** Which elevation of Figure 7.5 applies. */
  layout: 'e<d' | 'd<=e<5d' | 'e>=5d'
  zones: WallZoneResult[]
  /** Reference heights ze of the horizontal strips on the windward face — EN 1991-1-4 Figure 7.4. */
  referenceHeights_m: number[]
  notes: string[]
  caution: string
}

/**
 * cpe for a loaded area A between 1 and 10 m²: cpe = cpe,1 − (cpe,1 − cpe,10)·log10 A — EN 1991-1-4 Figure 7.2
 * (recommended procedure); cpe,1 below 1 m², cpe,10 above 10 m².
 */
export function cpeForArea(cpe1: number, cpe10: number, loadedArea_m2: number): number {
  requireFinite('cpe1', cpe1)
  requireFinite('cpe10', cpe10)
  const a = requirePositive('loadedArea_m2', loadedArea_m2)
  if (a <= 1) return cpe1
  if (a >= 10) return cpe10
  return cpe1 - (cpe1 - cpe10) * Math.log10(a)
}

/** Linear interpolation of Table 7.1 between the tabulated h/d rows, held constant outside them (§7.2.2 Note 1). */
function interpolateHOverD(hOverD: number, zone: WallZone, key: 'cpe10' | 'cpe1'): number {
  const rows = WALL_CPE_TABLE // ordered 5, 1, 0.25
  if (hOverD >= rows[0]!.hOverD) return rows[0]![key][zone]
  const last = rows[rows.length - 1]!
  if (hOverD <= last.hOverD) return last[key][zone]
  for (let i = 0; i < rows.length - 1; i++) {
    const hi = rows[i]!
    const lo = rows[i + 1]!
    if (hOverD <= hi.hOverD && hOverD >= lo.hOverD) {
      const t = (hOverD - lo.hOverD) / (hi.hOverD - lo.hOverD)
      return lo[key][zone] + t * (hi[key][zone] - lo[key][zone])
    }
  }
  /* c8 ignore next */
  return last[key][zone]
}

/** Strip heights of the windward face: h ≤ b one strip; b < h ≤ 2b two; h > 2b a strip at b, strips between, and h. */
function referenceHeights(b: number, h: number): number[] {
  if (h <= b) return [h]
  if (h <= 2 * b) return [b, h]
  // Figure 7.4 lets the middle part be split into strips of height hstrip; strips of b keep it simple and conservative.
  const heights = [b]
  let top = b
  while (top + b < h - b) {
    top += b
    heights.push(top)
  }
  heights.push(h - b)
  heights.push(h)
  return heights.filter((v, i, arr) => i === 0 || v > arr[i - 1]!)
}

/**
 * Pressure zones A–E on the walls of a rectangular-plan building with their widths and cpe for the loaded area —
 * EN 1991-1-4 §7.2.2, Figure 7.5 and Table 7.1.
 *
 * Zones A, B, C lie on the side walls, measured from the windward corner; D is the windward face and E the
 * leeward face. For a facade of length L on a building whose other plan dimension is W, the facade's own
 * suction zones come from wind parallel to it: call with d = L and b = W. Wind from the other end mirrors
 * the zones, so both ends of the facade take zone A.
 */
export function wallPressureCoefficients(input: WallPressureCoefficientsInput): WallPressureCoefficientsResult {
  const b = requirePositive('b', input.b)
  const d = requirePositive('d', input.d)
  const h = requirePositive('h', input.h)
  const area = requirePositive('loadedArea_m2', input.loadedArea_m2)

  const e = Math.min(b, 2 * h)
  const hOverD = h / d
  const notes: string[] = []
  const side: Array<{ zone: WallZone; width: number; start: number }> = []
  let layout: WallPressureCoefficientsResult['layout']
  if (e < d) {
    layout = 'e<d'
    side.push({ zone: 'A', width: e / 5, start: 0 })
    side.push({ zone: 'B', width: (4 * e) / 5, start: e / 5 })
    side.push({ zone: 'C', width: d - e, start: e })
  } else if (e < 5 * d) {
    layout = 'd<=e<5d'
    side.push({ zone: 'A', width: e / 5, start: 0 })
    side.push({ zone: 'B', width: d - e / 5, start: e / 5 })
  } else {
    layout = 'e>=5d'
    side.push({ zone: 'A', width: d, start: 0 })
  }
  if (hOverD > 5) {
    notes.push('h/d exceeds 5: Table 7.1 values for h/d = 5 are used; §7.2.2 Note 2 sends such buildings to §7.6–7.8 for overall loading.')
  }
  notes.push('Local cladding coefficients; the lack-of-correlation factor of §7.2.2(3) applies to overall force, not to fixings.')

  const zoneResult = (zone: WallZone, face: WallZoneResult['face'], width: number, start: number): WallZoneResult => {
    const cpe10 = interpolateHOverD(hOverD, zone, 'cpe10')
    const cpe1 = interpolateHOverD(hOverD, zone, 'cpe1')
    return { zone, face, width_m: width, start_m: start, cpe10, cpe1, cpe: cpeForArea(cpe1, cpe10, area) }
  }
  const zones: WallZoneResult[] = side.map((s) => zoneResult(s.zone, 'side', s.width, s.start))
  zones.push(zoneResult('D', 'windward', b, 0))
  zones.push(zoneResult('E', 'leeward', b, 0))

  return { e, hOverD, layout, zones, referenceHeights_m: referenceHeights(b, h), notes, caution: WIND_ENGINEER_CAUTION }
}

export interface AnchorsPerM2Input {
  /** Peak velocity pressure (Pa). */
  qp: number
  /** External pressure coefficient of the zone; the suction magnitude |cpe| is used. */
  cpe: number
  /**
   * Design resistance of one anchor (kN): the lesser of pull-out from the substrate and pull-through of the board,
   * each already divided by its safety factor.
   */
  anchorResistance_kN: number
  /** Partial factor on the wind action; 1.5 recommended (EN 1990 Table A1.2(B)). */
  gammaQ?: number
  /** The system's minimum anchors per m²; 6 is common practice for ETICS in the field. */
  minimumPerM2?: number
  /** Optional anchor patterns the system offers (per m²); the result is rounded up to the next one. */
  patterns?: number[]
}

export interface AnchorsPerM2Result {
  /** Design suction wEd = γQ·qp·|cpe| (kN/m²). */
  wEd_kNm2: number
  /** Number needed by load, unrounded. */
  requiredUnrounded: number
  /** Number needed by load, rounded up to a whole anchor. */
  requiredRoundedUp: number
  minimumPerM2: number
  /** Anchors per m² to install: the larger of load and minimum, raised to the next pattern when patterns are given. */
  perM2: number
  governs: 'load' | 'minimum'
  /** True when patterns were given and none is large enough. */
  exceedsPatterns: boolean
  caution: string
}

const DEFAULT_GAMMA_Q = 1.5
const DEFAULT_MINIMUM_ANCHORS = 6

/**
 * Anchors per m² for an ETICS zone: n ≥ wEd/NRd with wEd = γQ·qp·|cpe| — the verification format used by
 * EAD 330196 (anchors) and EAD 040083 (ETICS), with EN 1990 γQ; never fewer than the system minimum.
 * The sign of cpe is ignored on purpose: a positive coefficient is treated as if it were suction, which is
 * conservative and keeps a mistyped sign from under-anchoring.
 */
export function anchorsPerM2(input: AnchorsPerM2Input): AnchorsPerM2Result {
  const qp = requirePositive('qp', input.qp)
  const cpe = requireFinite('cpe', input.cpe)
  const resistance = requirePositive('anchorResistance_kN', input.anchorResistance_kN)
  const gammaQ = input.gammaQ === undefined ? DEFAULT_GAMMA_Q : requireRange('gammaQ', input.gammaQ, 1, 3)
  const minimum =
    input.minimumPerM2 === undefined ? DEFAULT_MINIMUM_ANCHORS : requireRange('minimumPerM2', input.minimumPerM2, 0, 100)
  const patterns = (input.patterns ?? []).map((p, i) => requirePositive(`patterns[${i}]`, p)).sort((x, y) => x - y)

  const wEd = (gammaQ * qp * Math.abs(cpe)) / 1000
  const requiredUnrounded = wEd / resistance
  // A tolerance keeps 6.0000000001 from becoming 7 through float noise.
  const requiredRoundedUp = Math.ceil(requiredUnrounded - 1e-9)
  const governs: AnchorsPerM2Result['governs'] = requiredRoundedUp > minimum ? 'load' : 'minimum'
  let perM2 = Math.max(requiredRoundedUp, Math.ceil(minimum - 1e-9))
  let exceedsPatterns = false
  if (patterns.length > 0) {
    const pattern = patterns.find((p) => p >= perM2 - 1e-9)
    if (pattern === undefined) exceedsPatterns = true
    else perM2 = pattern
  }
  return {
    wEd_kNm2: wEd,
    requiredUnrounded,
    requiredRoundedUp,
    minimumPerM2: minimum,
    perM2,
    governs,
    exceedsPatterns,
    caution: WIND_ENGINEER_CAUTION,
  }
}

export interface AnchorLayoutZoneInput {
  /** Zone label, usually A, B or C of Figure 7.5. */
  zone: string
  /** Facade area in the zone (m²), openings deducted. */
  area_m2: number
  /** cpe for the zone (suction). */
  cpe: number
  /** Edge zone or field; defaults to edge for zone A and field for the rest. */
  edge?: boolean
}

export interface AnchorLayoutInput {
  qp: number
  anchorResistance_kN: number
  gammaQ?: number
  minimumPerM2?: number
  patterns?: number[]
  zones: AnchorLayoutZoneInput[]
}

export interface AnchorLayoutZoneResult extends AnchorsPerM2Result {
  zone: string
  edge: boolean
  area_m2: number
  /** Anchors in the zone, rounded up to a whole anchor. */
  count: number
}

export interface AnchorLayoutResult {
  zones: AnchorLayoutZoneResult[]
  edgeCount: number
  fieldCount: number
  total: number
  edgeArea_m2: number
  fieldArea_m2: number
  /** Average anchors per m² over the whole facade (for quantities). */
  averagePerM2: number
  caution: string
}

/**
 * Anchor counts for a facade split into wind zones: each zone sized by {@link anchorsPerM2}, then counted over
 * its area. Edge zones (A) and the field (B, C) are totalled separately because they are installed to
 * different patterns.
 */
export function anchorLayout(input: AnchorLayoutInput): AnchorLayoutResult {
  if (!Array.isArray(input.zones) || input.zones.length === 0) {
    throw new CalcInputError('zones', 'zones must list at least one facade zone')
  }
  const zones = input.zones.map((z, i): AnchorLayoutZoneResult => {
    if (typeof z.zone !== 'string' || z.zone.trim() === '') {
      throw new CalcInputError(`zones[${i}].zone`, `zones[${i}].zone must name the zone`)
    }
    const area = requireRange(`zones[${i}].area_m2`, z.area_m2, 0, 1e6)
    const per = anchorsPerM2({
      qp: input.qp,
      cpe: requireFinite(`zones[${i}].cpe`, z.cpe),
      anchorResistance_kN: input.anchorResistance_kN,
      gammaQ: input.gammaQ,
      minimumPerM2: input.minimumPerM2,
      patterns: input.patterns,
    })
    const edge = z.edge ?? z.zone.trim().toUpperCase() === 'A'
    return { ...per, zone: z.zone, edge, area_m2: area, count: Math.ceil(area * per.perM2 - 1e-9) }
  })
  const sum = (f: (z: AnchorLayoutZoneResult) => number, edge: boolean) =>
    zones.filter((z) => z.edge === edge).reduce((s, z) => s + f(z), 0)
  const edgeCount = sum((z) => z.count, true)
  const fieldCount = sum((z) => z.count, false)
  const edgeArea = sum((z) => z.area_m2, true)
  const fieldArea = sum((z) => z.area_m2, false)
  const totalArea = edgeArea + fieldArea
  const total = edgeCount + fieldCount
  return {
    zones,
    edgeCount,
    fieldCount,
    total,
    edgeArea_m2: edgeArea,
    fieldArea_m2: fieldArea,
    averagePerM2: totalArea > 0 ? total / totalArea : 0,
    caution: WIND_ENGINEER_CAUTION,
  }
}
