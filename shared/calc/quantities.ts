/**
 * Material quantities for a single-leaf thin-joint block wall with ETICS.
 *
 * Geometry (blocks and joint volumes) follows from the unit and joint sizes; consumption rates, pack sizes and
 * waste allowances are common practice defaults that the system description and the user override.
 */
import { CalcInputError, requireFinite, requirePositive, requireRange } from './errors'

export interface BlocksPerM2Input {
  unitLength_mm: number
  unitHeight_mm: number
  joint_mm: number
}

/** Units per m² of wall face: 1 / ((l + j)·(h + j)), the coordinating size of one unit. */
export function blocksPerM2(input: BlocksPerM2Input): number {
  const l = requirePositive('unitLength_mm', input.unitLength_mm)
  const h = requirePositive('unitHeight_mm', input.unitHeight_mm)
  const j = requireRange('joint_mm', input.joint_mm, 0, 30)
  return 1e6 / ((l + j) * (h + j))
}

export interface MortarPerM2Input extends BlocksPerM2Input {
  /** Wall (unit) thickness through which the joints run (mm). */
  wallThickness_mm: number
  /**
   * 'filled' when perpends are mortared; 'unfilled' for tongue-and-groove units laid with dry perpends, where only
   * the bed joints take mortar.
   */
  perpends?: 'filled' | 'unfilled'
}

export interface MortarPerM2Result {
  /** Share of the wall face taken by mortar joints. */
  jointAreaFraction: number
  /** Fresh mortar volume per m² of wall (litres). */
  litres: number
  /** Same in m³. */
  m3: number
}

/**
 * Fresh mortar per m² of wall from the joint geometry: joint area fraction × wall thickness. Beds run the full
 * coordinating length (l + j), perpends the unit height h, so the fraction is 1 − l·h/((l+j)(h+j)) with filled
 * perpends and j/(h+j) with dry perpends. No allowance for waste or for mortar pressed into cores.
 */
export function mortarPerM2(input: MortarPerM2Input): MortarPerM2Result {
  const l = requirePositive('unitLength_mm', input.unitLength_mm)
  const h = requirePositive('unitHeight_mm', input.unitHeight_mm)
  const j = requireRange('joint_mm', input.joint_mm, 0, 30)
  const t = requirePositive('wallThickness_mm', input.wallThickness_mm)
  const perpends = input.perpends ?? 'filled'
  if (perpends !== 'filled' && perpends !== 'unfilled') {
    throw new CalcInputError('perpends', `perpends must be 'filled' or 'unfilled' (got ${String(perpends)})`)
  }
  const fraction = perpends === 'filled' ? 1 - (l * h) / ((l + j) * (h + j)) : j / (h + j)
  const m3 = fraction * (t / 1000)
  return { jointAreaFraction: fraction, litres: m3 * 1000, m3 }
}

/** Description of the wall system the quantities are taken for. Every rate has a common-practice default. */
export interface WallSystem {
  block: {
    length_mm: number
    height_mm: number
    thickness_mm: number
    /** Thin-layer bed joint (mm); about 3 mm in practice. */
    joint_mm?: number
    perpends?: 'filled' | 'unfilled'
  }
  /** Thin-layer mortar: fresh litres one bag makes (25 kg bag ≈ 15–17 L, practice). */
  thinLayerMortar?: { bagKg?: number; litresPerBag?: number }
  /** Levelling bed of general-purpose mortar under the first course. */
  starterCourse?: { bedThickness_mm?: number; litresPerBag?: number; bagKg?: number }
  insulation?: { boardLength_mm?: number; boardHeight_mm?: number; thickness_mm?: number }
  adhesive?: { kgPerM2?: number; bagKg?: number }
  /** System minimum anchors per m² when no wind result is given (commonly 6). */
  anchors?: { minimumPerM2?: number }
  mesh?: { rollWidth_m?: number; lap_mm?: number }
  /** Diagonal mesh patches at opening corners. */
  diagonalPatches?: { perOpening?: number }
  baseCoat?: { kgPerM2?: number; bagKg?: number }
  primer?: { kgPerM2?: number }
  finish?: { kgPerM2?: number }
}

export const QUANTITY_ITEMS = [
  'blocks',
  'thin-layer-mortar',
  'starter-mortar',
  'insulation-boards',
  'adhesive',
  'anchors',
  'mesh',
  'diagonal-patches',
  'base-coat',
  'primer',
  'finish',
  'base-track',
  'corner-bead',
  'drip-bead',
] as const
export type QuantityItem = (typeof QUANTITY_ITEMS)[number]

/** Default waste allowances (%), common practice; the user edits them per line. */
export const DEFAULT_WASTE_PERCENT: Readonly<Record<QuantityItem, number>> = {
  blocks: 5,
  'thin-layer-mortar': 10,
  'starter-mortar': 15,
  'insulation-boards': 7,
  adhesive: 10,
  anchors: 5,
  mesh: 10,
  'diagonal-patches': 0,
  'base-coat': 10,
  primer: 10,
  finish: 10,
  'base-track': 10,
  'corner-bead': 10,
  'drip-bead': 10,
}

/** Common-practice defaults for the system rates. */
export const WALL_SYSTEM_DEFAULTS = {
  joint_mm: 3,
  thinLayerBagKg: 25,
  thinLayerLitresPerBag: 16,
  starterBed_mm: 15,
  starterLitresPerBag: 14,
  starterBagKg: 25,
  boardLength_mm: 1200,
  boardHeight_mm: 600,
  adhesiveKgPerM2: 5,
  adhesiveBagKg: 25,
  minimumAnchorsPerM2: 6,
  meshRollWidth_m: 1.0,
  meshLap_mm: 100,
  patchesPerOpening: 4,
  baseCoatKgPerM2: 5,
  baseCoatBagKg: 25,
  primerKgPerM2: 0.2,
  finishKgPerM2: 2.5,
} as const

export interface WallQuantitiesInput {
  /** Gross wall area (m²). */
  area_m2: number
  /** Area of openings to deduct (m²). */
  openings_m2?: number
  /** Length of the wall at its base (m): starter course and base track. */
  baseLength_m: number
  /** Number of openings (for the diagonal patches). */
  openingsCount?: number
  /** Total perimeter of the openings (m): reveal corner beads. */
  openingsPerimeter_m?: number
  /** Length of window and door heads (m): drip beads. */
  openingHeads_m?: number
  /** Height of external vertical corners added together (m): corner beads. */
  externalCorners_m?: number
  system: WallSystem
  /** Anchors per m² from the wind calculation; the system minimum is used when absent. */
  anchorsPerM2?: number
  /** Total anchor count from a zone layout; overrides anchorsPerM2 when given. */
  anchorCount?: number
  /** Waste allowance per line (%), replacing the default. */
  waste?: Partial<Record<QuantityItem, number>>
}

export interface QuantityLine {
  item: QuantityItem
  label: string
  unit: string
  /** Quantity before waste, unrounded. */
  net: number
  wastePercent: number
  /** net × (1 + waste), rounded up to a whole unit. */
  gross: number
  /** How the net quantity was reached, with its basis. */
  basis: string
}

export interface WallQuantitiesResult {
  netArea_m2: number
  lines: QuantityLine[]
  anchorsSource: 'wind-layout' | 'wind-per-m2' | 'system-minimum'
  notes: string[]
}

function optionalPositive(field: string, value: number | undefined, fallback: number): number {
  return value === undefined ? fallback : requirePositive(field, value)
}
function optionalNonNegative(field: string, value: number | undefined): number {
  return value === undefined ? 0 : requireRange(field, value, 0, 1e7)
}

/**
 * Material take-off for the wall and its ETICS: each line with net quantity, an editable waste allowance and the
 * gross order quantity. Blocks and mortar follow from {@link blocksPerM2} and {@link mortarPerM2}; the other
 * consumption rates are common practice defaults unless the system gives its own.
 */
export function wallQuantities(input: WallQuantitiesInput): WallQuantitiesResult {
  const area = requirePositive('area_m2', input.area_m2)
  const openings = optionalNonNegative('openings_m2', input.openings_m2)
  if (openings >= area) {
    throw new CalcInputError('openings_m2', `openings_m2 (${openings}) must be smaller than the wall area (${area})`)
  }
  const net = area - openings
  const baseLength = requirePositive('baseLength_m', input.baseLength_m)
  const openingsCount = optionalNonNegative('openingsCount', input.openingsCount)
  if (!Number.isInteger(openingsCount)) throw new CalcInputError('openingsCount', 'openingsCount must be a whole number')
  const openingsPerimeter = optionalNonNegative('openingsPerimeter_m', input.openingsPerimeter_m)
  const openingHeads = optionalNonNegative('openingHeads_m', input.openingHeads_m)
  const corners = optionalNonNegative('externalCorners_m', input.externalCorners_m)

  const sys = input.system
  if (!sys || !sys.block) throw new CalcInputError('system.block', 'system.block must describe the masonry unit')
  const D = WALL_SYSTEM_DEFAULTS
  const block = {
    length: requirePositive('system.block.length_mm', sys.block.length_mm),
    height: requirePositive('system.block.height_mm', sys.block.height_mm),
    thickness: requirePositive('system.block.thickness_mm', sys.block.thickness_mm),
    joint: sys.block.joint_mm === undefined ? D.joint_mm : requireRange('system.block.joint_mm', sys.block.joint_mm, 0, 30),
  }
  const waste = (item: QuantityItem): number => {
    const w = input.waste?.[item]
    return w === undefined ? DEFAULT_WASTE_PERCENT[item] : requireRange(`waste.${item}`, w, 0, 100)
  }
  const lines: QuantityLine[] = []
  const add = (item: QuantityItem, label: string, unit: string, netQty: number, basis: string) => {
    requireFinite(item, netQty)
    const w = waste(item)
    // The tolerance keeps exact products (e.g. 10.000000001 boards) from rounding up a whole unit.
    const gross = netQty <= 0 ? 0 : Math.ceil(netQty * (1 + w / 100) - 1e-9)
    lines.push({ item, label, unit, net: netQty, wastePercent: w, gross, basis })
  }

  const perM2 = blocksPerM2({ unitLength_mm: block.length, unitHeight_mm: block.height, joint_mm: block.joint })
  add('blocks', 'Masonry units', 'nr', perM2 * net, `${perM2.toFixed(2)} units/m² (${block.length}×${block.height} mm, ${block.joint} mm joints) × ${net.toFixed(2)} m²`)

  const mortar = mortarPerM2({
    unitLength_mm: block.length,
    unitHeight_mm: block.height,
    joint_mm: block.joint,
    wallThickness_mm: block.thickness,
    perpends: sys.block.perpends,
  })
  const tlBagKg = optionalPositive('system.thinLayerMortar.bagKg', sys.thinLayerMortar?.bagKg, D.thinLayerBagKg)
  const tlLitres = optionalPositive('system.thinLayerMortar.litresPerBag', sys.thinLayerMortar?.litresPerBag, D.thinLayerLitresPerBag)
  add('thin-layer-mortar', `Thin-layer mortar, ${tlBagKg} kg bags`, 'bag', (mortar.litres * net) / tlLitres, `${mortar.litres.toFixed(2)} L/m² ÷ ${tlLitres} L per bag (practice)`)

  const bed = optionalPositive('system.starterCourse.bedThickness_mm', sys.starterCourse?.bedThickness_mm, D.starterBed_mm)
  const stLitres = optionalPositive('system.starterCourse.litresPerBag', sys.starterCourse?.litresPerBag, D.starterLitresPerBag)
  const stBagKg = optionalPositive('system.starterCourse.bagKg', sys.starterCourse?.bagKg, D.starterBagKg)
  const starterLitres = baseLength * (block.thickness / 1000) * (bed / 1000) * 1000
  add('starter-mortar', `Starter-course levelling mortar, ${stBagKg} kg bags`, 'bag', starterLitres / stLitres, `${baseLength} m × ${block.thickness} mm × ${bed} mm bed ÷ ${stLitres} L per bag (practice)`)

  const boardL = optionalPositive('system.insulation.boardLength_mm', sys.insulation?.boardLength_mm, D.boardLength_mm)
  const boardH = optionalPositive('system.insulation.boardHeight_mm', sys.insulation?.boardHeight_mm, D.boardHeight_mm)
  const boardArea = (boardL * boardH) / 1e6
  const thick = sys.insulation?.thickness_mm === undefined ? '' : `, ${requirePositive('system.insulation.thickness_mm', sys.insulation.thickness_mm)} mm`
  add('insulation-boards', `Insulation boards ${boardL}×${boardH}${thick}`, 'board', net / boardArea, `${net.toFixed(2)} m² ÷ ${boardArea.toFixed(3)} m² per board`)

  const adhKg = optionalPositive('system.adhesive.kgPerM2', sys.adhesive?.kgPerM2, D.adhesiveKgPerM2)
  const adhBag = optionalPositive('system.adhesive.bagKg', sys.adhesive?.bagKg, D.adhesiveBagKg)
  add('adhesive', `Board adhesive, ${adhBag} kg bags`, 'bag', (adhKg * net) / adhBag, `${adhKg} kg/m² (practice) × ${net.toFixed(2)} m² ÷ ${adhBag} kg`)

  const minAnchors = sys.anchors?.minimumPerM2 === undefined ? D.minimumAnchorsPerM2 : requireRange('system.anchors.minimumPerM2', sys.anchors.minimumPerM2, 0, 100)
  let anchorsNet: number
  let anchorsSource: WallQuantitiesResult['anchorsSource']
  let anchorsBasis: string
  if (input.anchorCount !== undefined) {
    anchorsNet = requireRange('anchorCount', input.anchorCount, 0, 1e8)
    anchorsSource = 'wind-layout'
    anchorsBasis = 'count from the wind zone layout'
  } else if (input.anchorsPerM2 !== undefined) {
    const per = requireRange('anchorsPerM2', input.anchorsPerM2, 0, 100)
    anchorsNet = per * net
    anchorsSource = 'wind-per-m2'
    anchorsBasis = `${per}/m² from the wind calculation × ${net.toFixed(2)} m²`
  } else {
    anchorsNet = minAnchors * net
    anchorsSource = 'system-minimum'
    anchorsBasis = `system minimum ${minAnchors}/m² × ${net.toFixed(2)} m² (no wind result given)`
  }
  add('anchors', 'Insulation anchors', 'nr', anchorsNet, anchorsBasis)

  const rollWidth = optionalPositive('system.mesh.rollWidth_m', sys.mesh?.rollWidth_m, D.meshRollWidth_m)
  const lap = sys.mesh?.lap_mm === undefined ? D.meshLap_mm : requireRange('system.mesh.lap_mm', sys.mesh.lap_mm, 0, 500)
  if (lap / 1000 >= rollWidth) throw new CalcInputError('system.mesh.lap_mm', 'system.mesh.lap_mm must be less than the roll width')
  const lapFactor = rollWidth / (rollWidth - lap / 1000)
  add('mesh', 'Reinforcing mesh', 'm²', net * lapFactor, `${net.toFixed(2)} m² × ${lapFactor.toFixed(3)} for ${lap} mm laps on ${rollWidth} m rolls`)

  const perOpening = sys.diagonalPatches?.perOpening === undefined ? D.patchesPerOpening : requireRange('system.diagonalPatches.perOpening', sys.diagonalPatches.perOpening, 0, 20)
  add('diagonal-patches', 'Diagonal mesh patches at opening corners', 'nr', openingsCount * perOpening, `${openingsCount} openings × ${perOpening}`)

  const bcKg = optionalPositive('system.baseCoat.kgPerM2', sys.baseCoat?.kgPerM2, D.baseCoatKgPerM2)
  const bcBag = optionalPositive('system.baseCoat.bagKg', sys.baseCoat?.bagKg, D.baseCoatBagKg)
  add('base-coat', `Base coat, ${bcBag} kg bags`, 'bag', (bcKg * net) / bcBag, `${bcKg} kg/m² (practice) × ${net.toFixed(2)} m² ÷ ${bcBag} kg`)

  const primerKg = optionalPositive('system.primer.kgPerM2', sys.primer?.kgPerM2, D.primerKgPerM2)
  add('primer', 'Primer', 'kg', primerKg * net, `${primerKg} kg/m² (practice) × ${net.toFixed(2)} m²`)

  const finishKg = optionalPositive('system.finish.kgPerM2', sys.finish?.kgPerM2, D.finishKgPerM2)
  add('finish', 'Finish render', 'kg', finishKg * net, `${finishKg} kg/m² (practice) × ${net.toFixed(2)} m²`)

  add('base-track', 'Base track', 'm', baseLength, 'length of the wall at its base')
  add('corner-bead', 'Corner beads (corners and reveals)', 'm', corners + openingsPerimeter, `${corners} m corners + ${openingsPerimeter} m reveals`)
  add('drip-bead', 'Drip beads at heads', 'm', openingHeads, 'length of opening heads')

  const notes = [
    'Consumption rates, bag yields and waste allowances are common practice defaults; the system data sheet replaces them.',
    'Reveal insulation and mesh are not included in the areas.',
  ]
  return { netArea_m2: net, lines, anchorsSource, notes }
}
