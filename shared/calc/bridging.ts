import { CalcInputError, requireFinite, requirePositive, requireRange } from './errors'
import type { BridgingHeatLossInput } from './schemas'

/**
 * Default y-values, W/m²K [published: Technical Guidance Document L (Ireland), Appendix D; also England's
 * earlier SAP conventions].
 */
export const DEFAULT_Y_VALUES = [
  { id: 'default', y: 0.15, label: 'Default where the junctions are not assessed', source: 'published: Technical Guidance Document L (Ireland), Appendix D' },
  { id: 'acceptable-details', y: 0.08, label: 'Default where acceptable construction details are followed', source: 'published: Technical Guidance Document L (Ireland), Appendix D' },
] as const

export const BRIDGING_CAUTION
  = 'Indicative transmission heat loss through thermal bridges. Each ψ must come from a numerical model to '
    + 'EN ISO 10211 or a recognised set of details for the junction as built; a competent designer confirms the '
    + 'values under the local building regulations.'

export interface BridgingHeatLossResult {
  /** HTB = Σ ψ·L + Σ χ, W/K. */
  htb: number
  /** y = HTB / ΣA_exp, W/m²K. */
  yValue: number
  junctions: { name?: string, psi: number, length_m: number, heatLoss: number }[]
  /** Against each default y: the heat loss it would assume and whether the calculated y is at or below it. */
  comparisons: { id: string, label: string, y: number, htb: number, atOrBelow: boolean, saving: number, source: string }[]
  caution: string
  standard: string[]
}

/**
 * Heat transfer coefficient of the linear (and point) thermal bridges of a building, HTB = Σ ψk·Lk + Σ χj
 * (EN ISO 14683 / EN ISO 10211 §9), and its equivalent y = HTB / ΣA_exp over the exposed element area, compared
 * with the default y-values 0.15 and 0.08 W/m²K.
 */
export function bridgingHeatLoss(input: BridgingHeatLossInput): BridgingHeatLossResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the junctions and the exposed area')
  if (!Array.isArray(input.junctions)) throw new CalcInputError('junctions', 'Give the junctions as a list (it may be empty)')
  const area = requirePositive('exposedArea_m2', input.exposedArea_m2)
  const junctions = input.junctions.map((j, i) => {
    if (j === null || typeof j !== 'object') throw new CalcInputError(`junctions[${i}]`, `Junction ${i + 1} is not a junction`)
    const psi = requireRange(`junctions[${i}].psi`, j.psi, -2, 2)
    const length = requireRange(`junctions[${i}].length_m`, j.length_m, 0, 100000)
    return { ...(j.name === undefined ? {} : { name: j.name }), psi, length_m: length, heatLoss: psi * length }
  })
  let points = 0
  ;(input.points ?? []).forEach((p, i) => {
    const chi = requireRange(`points[${i}].chi`, p?.chi, -1, 1)
    const count = requireFinite(`points[${i}].count`, p?.count)
    if (count < 0 || !Number.isInteger(count)) throw new CalcInputError(`points[${i}].count`, 'The count of point bridges must be a whole number, zero or more')
    points += chi * count
  })
  const htb = junctions.reduce((s, j) => s + j.heatLoss, 0) + points
  const yValue = htb / area
  return {
    htb,
    yValue,
    junctions,
    comparisons: DEFAULT_Y_VALUES.map(d => ({
      id: d.id,
      label: d.label,
      y: d.y,
      htb: d.y * area,
      atOrBelow: yValue <= d.y,
      saving: d.y * area - htb,
      source: d.source,
    })),
    caution: BRIDGING_CAUTION,
    standard: ['EN ISO 10211 (ψ from a numerical model)', 'EN ISO 14683 (HTB = Σ ψ·L)', 'Technical Guidance Document L (Ireland) Appendix D (default y)'],
  }
}
