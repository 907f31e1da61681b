import { CalcInputError, requirePositive, requireRange } from './errors'
import type { MouldRiskInput, MouldUse } from './schemas'
import { psatFormula, saturationPressure } from './moisture'

/** Inside surface resistance for surface-humidity assessments, EN ISO 13788:2012 §5 [recalled]. */
export const RSI_MOULD = 0.25

/** Surface RH above which mould growth is assumed possible, EN ISO 13788:2012 §5 [recalled]. */
export const MOULD_SURFACE_RH = 80

/** Minimum fRsi by building use [published: Technical Guidance Document L 2019 (Ireland), Appendix D]. */
export const MIN_FRSI: Record<MouldUse, { value: number, source: string }> = {
  'dwelling': { value: 0.75, source: 'published: Technical Guidance Document L 2019 (Ireland), Appendix D' },
  'ground-floor-corner': { value: 0.7, source: 'published: Technical Guidance Document L 2019 (Ireland), Appendix D (3-D corners at ground floor)' },
}

export const MOULD_CAUTION
  = 'Indicative surface-humidity check for a plane element. Junctions and corners need their own fRsi from a '
    + 'numerical model (EN ISO 10211); a competent designer confirms the details under the local building '
    + 'regulations.'

/**
 * Temperature factor at the inside surface of a plane element, fRsi = 1 − U·Rsi (EN ISO 13788:2012 §5,
 * with Rsi = 0.25 m²K/W for the surface-humidity check).
 */
export function surfaceTemperatureFactor(u: number, rsi: number = RSI_MOULD): number {
  const uu = requirePositive('u', u)
  if (uu > 10) throw new CalcInputError('u', `A U-value above 10 W/m²K is not plausible (got ${uu})`)
  const r = requirePositive('rsi', rsi)
  if (r > 1) throw new CalcInputError('rsi', `An inside surface resistance above 1 m²K/W is not plausible (got ${r})`)
  return 1 - uu * r
}

export interface MouldRiskResult {
  fRsi: number
  /** The governing minimum: the larger of the use's minimum and, with inside conditions, the 80 % RH criterion. */
  fRsiMin: number
  fRsiMinForUse: number
  fRsiMinSource: string
  /** From EN ISO 13788 §5 for the given inside conditions: surface RH ≤ 80 %. */
  fRsiMinForConditions: number | null
  /** Inside surface temperature and relative humidity, when inside conditions are given. */
  surfaceTempC: number | null
  surfaceRhPercent: number | null
  pass: boolean
  use: MouldUse
  caution: string
  standard: string[]
}

/**
 * Surface-mould check of a plane element: fRsi = 1 − 0.25·U against the minimum for the building use
 * (0.75 for dwellings, TGD L 2019 Appendix D) and, when inside conditions are given, the EN ISO 13788:2012 §5
 * criterion that the surface RH stays at or below 80 %: fRsi,min = (θsi,min − θe)/(θi − θe).
 */
export function mouldRisk(input: MouldRiskInput): MouldRiskResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the U-value and the conditions')
  const use: MouldUse = input.use ?? 'dwelling'
  const min = MIN_FRSI[use]
  if (!min) throw new CalcInputError('use', `Unknown building use "${String(use)}"`)
  const fRsi = surfaceTemperatureFactor(input.u, RSI_MOULD)
  const te = requireRange('outsideTempC', input.outsideTempC, -60, 80)

  let fRsiMinForConditions: number | null = null
  let surfaceTempC: number | null = null
  let surfaceRhPercent: number | null = null
  if (input.inside !== undefined) {
    if (input.inside === null || typeof input.inside !== 'object') throw new CalcInputError('inside', 'Give the inside temperature and relative humidity')
    const ti = requireRange('inside.tempC', input.inside.tempC, -60, 80)
    const rh = requireRange('inside.rhPercent', input.inside.rhPercent, 0, 100)
    if (ti <= te) throw new CalcInputError('inside.tempC', 'The inside must be warmer than the outside for a surface temperature factor')
    const pi = rh / 100 * saturationPressure(ti)
    const pLimit = pi / (MOULD_SURFACE_RH / 100)
    // Minimum surface temperature at which the surface RH stays at 80 %: invert psat over water, since mould
    // needs liquid-phase conditions and the limit lies above 0 °C in any heated room.
    const x = Math.log(pLimit / 610.5)
    const tsiMin = pLimit >= 610.5 ? 237.3 * x / (17.269 - x) : 265.5 * x / (21.875 - x)
    fRsiMinForConditions = (tsiMin - te) / (ti - te)
    surfaceTempC = te + fRsi * (ti - te)
    surfaceRhPercent = 100 * pi / psatFormula(surfaceTempC)
  }
  const fRsiMin = Math.max(min.value, fRsiMinForConditions ?? -Infinity)
  return {
    fRsi,
    fRsiMin,
    fRsiMinForUse: min.value,
    fRsiMinSource: min.source,
    fRsiMinForConditions,
    surfaceTempC,
    surfaceRhPercent,
    pass: fRsi >= fRsiMin,
    use,
    caution: MOULD_CAUTION,
    standard: [
      'EN ISO 13788:2012 §5 surface temperature to avoid mould (surface RH ≤ 80 %, Rsi 0.25)',
      'Technical Guidance Document L 2019 (Ireland) Appendix D: minimum fRsi',
    ],
  }
}
