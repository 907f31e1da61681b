import { CalcInputError, requirePositive, requireRange } from './errors'
import type { ClimatePoint, CondensationAtInput, CondensationYearInput, VapourLayer } from './schemas'
import { RSE, RSI_HORIZONTAL } from './uvalue'

/** Water-vapour permeability of still air, δ0, kg/(m·s·Pa), EN ISO 13788:2012 §4 [recalled]. */
export const DELTA0 = 2e-10

/** Excess internal vapour pressure at θe ≤ 0 °C for humidity classes 1–5, Pa [recalled — verify]. */
export const HUMIDITY_CLASS_EXCESS = [270, 540, 810, 1080, 1350] as const

/** Safety factor on the humidity-class excess, EN ISO 13788:2012 §4 [recalled]. */
export const HUMIDITY_CLASS_FACTOR = 1.1

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const

/** Rates below this (about 0.3 mg/m² a month) come from rounding, not from condensation. */
const RATE_EPSILON = 1e-13

const TEMP_MIN = -60
const TEMP_MAX = 80

export const MOISTURE_CAUTION
  = 'Indicative assessment by the Glaser method of EN ISO 13788:2012. It ignores moisture storage, liquid '
    + 'transport, driving rain, built-in moisture and air leakage, so it informs design and proves nothing on its '
    + 'own; where the risk matters a competent designer confirms the build-up, if need be by a dynamic '
    + 'simulation to EN 15026, under the local building regulations.'

/**
 * Saturation vapour pressure over water (θ ≥ 0 °C) or ice (θ < 0 °C), Pa, EN ISO 13788:2012 Annex E [recalled]:
 * 610.5·exp(17.269θ/(237.3 + θ)) and 610.5·exp(21.875θ/(265.5 + θ)).
 */
export function saturationPressure(tempC: number): number {
  return psatFormula(requireRange('tempC', tempC, TEMP_MIN, TEMP_MAX))
}

/** The same formula without the input check, for temperatures the engine derived itself. */
export function psatFormula(t: number): number {
  return t >= 0 ? 610.5 * Math.exp(17.269 * t / (237.3 + t)) : 610.5 * Math.exp(21.875 * t / (265.5 + t))
}

/**
 * Dew-point temperature of air at `tempC` and `rhPercent`, °C: the exact inverse of `saturationPressure`
 * (EN ISO 13788:2012 Annex E), over ice below 0 °C (frost point).
 */
export function dewPoint(tempC: number, rhPercent: number): number {
  const t = requireRange('tempC', tempC, TEMP_MIN, TEMP_MAX)
  const rh = requireRange('rhPercent', rhPercent, 0, 100)
  if (rh === 0) throw new CalcInputError('rhPercent', 'Dry air (0 % relative humidity) has no dew point; give a humidity above 0 %')
  const p = rh / 100 * saturationPressure(t)
  const x = Math.log(p / 610.5)
  return p >= 610.5 ? 237.3 * x / (17.269 - x) : 265.5 * x / (21.875 - x)
}

interface Wall {
  /** Cumulative sd from the inside surface at each interface, m. */
  s: number[]
  /** Cumulative thermal resistance from the inside air at each interface, m²K/W. */
  r: number[]
  totalR: number
}

function resolveWall(layers: unknown, rsiIn: unknown, rseIn: unknown): Wall {
  if (!Array.isArray(layers) || layers.length === 0) throw new CalcInputError('layers', 'Add at least one layer to the build-up')
  const rsi = rsiIn === undefined ? RSI_HORIZONTAL : requireRange('rsi', rsiIn, 0, 1)
  const rse = rseIn === undefined ? RSE : requireRange('rse', rseIn, 0, 1)
  const s = [0]
  const r = [rsi]
  layers.forEach((raw: VapourLayer, i) => {
    const field = `layers[${i}]`
    if (raw === null || typeof raw !== 'object') throw new CalcInputError(field, `Layer ${i + 1} is not a layer`)
    let ri: number
    let sdi: number
    if ('resistance' in raw && raw.resistance !== undefined) {
      ri = requirePositive(`${field}.resistance`, raw.resistance)
      // An sd of zero would give an unbounded rate at a plane touching it; EN ISO 13788 gives still air layers
      // a small sd of their own, so a positive value is always available.
      sdi = requirePositive(`${field}.sd`, (raw as { sd?: unknown }).sd)
    }
    else {
      const l = raw as { thickness_mm?: unknown, lambda?: unknown, mu?: unknown }
      const d = requirePositive(`${field}.thickness_mm`, l.thickness_mm) / 1000
      ri = d / requirePositive(`${field}.lambda`, l.lambda)
      sdi = d * requirePositive(`${field}.mu`, l.mu)
    }
    s.push(s[s.length - 1]! + sdi)
    r.push(r[r.length - 1]! + ri)
  })
  return { s, r, totalR: r[r.length - 1]! + rse }
}

function climatePoint(field: string, c: unknown): ClimatePoint {
  if (c === null || typeof c !== 'object') throw new CalcInputError(field, `Give ${field} as a temperature and a relative humidity`)
  const o = c as ClimatePoint
  return {
    tempC: requireRange(`${field}.tempC`, o.tempC, TEMP_MIN, TEMP_MAX),
    rhPercent: requireRange(`${field}.rhPercent`, o.rhPercent, 0, 100),
  }
}

interface Profile {
  p: number[]
  /** Interior interfaces where the vapour-pressure line meets saturation, with the net rate there (+ condenses). */
  vertices: { index: number, rate: number }[]
  fluxIn: number
  fluxOut: number
}

/**
 * The Glaser vapour-pressure line: fixed at the two surfaces and at wet planes, and elsewhere the lower convex
 * hull of the saturation points, i.e. the line drawn taut beneath psat. It touches psat only where vapour
 * arrives faster than it leaves, which is how tangents from pi and pe find every condensation plane at once.
 */
function glaserProfile(s: number[], psat: number[], pStart: number, pEnd: number, wet: ReadonlySet<number>): Profile {
  const n = s.length - 1
  const fixed = [0, ...[...wet].filter(i => i > 0 && i < n).sort((a, b) => a - b), n]
  const y = (i: number) => (i === 0 ? pStart : i === n ? pEnd : psat[i]!)
  const hull: number[] = [0]
  for (let f = 0; f + 1 < fixed.length; f++) {
    const a = fixed[f]!
    const b = fixed[f + 1]!
    const seg = [a]
    for (let k = a + 1; k <= b; k++) {
      while (seg.length >= 2) {
        const o = seg[seg.length - 2]!
        const m = seg[seg.length - 1]!
        const cross = (s[m]! - s[o]!) * (y(k) - y(o)) - (y(m) - y(o)) * (s[k]! - s[o]!)
        if (cross <= 0) seg.pop()
        else break
      }
      seg.push(k)
    }
    hull.push(...seg.slice(1))
  }
  const p = new Array<number>(n + 1)
  for (let h = 0; h + 1 < hull.length; h++) {
    const a = hull[h]!
    const b = hull[h + 1]!
    for (let k = a; k <= b; k++) p[k] = y(a) + (y(b) - y(a)) * (s[k]! - s[a]!) / (s[b]! - s[a]!)
    p[b] = y(b)
  }
  const flux = (a: number, b: number) => DELTA0 * (p[a]! - p[b]!) / (s[b]! - s[a]!)
  const vertices: { index: number, rate: number }[] = []
  for (let h = 1; h + 1 < hull.length; h++) {
    const i = hull[h]!
    vertices.push({ index: i, rate: flux(hull[h - 1]!, i) - flux(i, hull[h + 1]!) })
  }
  return { p, vertices, fluxIn: flux(hull[0]!, hull[1]!), fluxOut: flux(hull[hull.length - 2]!, hull[hull.length - 1]!) }
}

interface Conditions {
  tempIn: number
  tempOut: number
  pIn: number
  pOut: number
}

interface SteadyState {
  tempC: number[]
  psat: number[]
  profile: Profile
  surfaceInside: boolean
  surfaceOutside: boolean
}

function steadyState(wall: Wall, c: Conditions, wet: ReadonlySet<number>): SteadyState {
  const dT = c.tempIn - c.tempOut
  const tempC = wall.r.map(r => c.tempIn - dT * r / wall.totalR)
  const psat = tempC.map(saturationPressure)
  const n = tempC.length - 1
  const surfaceInside = c.pIn > psat[0]!
  const surfaceOutside = c.pOut > psat[n]!
  const profile = glaserProfile(wall.s, psat, Math.min(c.pIn, psat[0]!), Math.min(c.pOut, psat[n]!), wet)
  return { tempC, psat, profile, surfaceInside, surfaceOutside }
}

export interface GlaserInterface {
  /** 0 is the inside surface, `layers.length` the outside surface; k lies between layers k−1 and k. */
  index: number
  tempC: number
  psat: number
  p: number
  /** Cumulative sd from the inside surface, m. */
  sd: number
}

export interface CondensationAtResult {
  interfaces: GlaserInterface[]
  /** Interfaces at which vapour condenses. */
  planes: number[]
  planeRates: { index: number, rate: number }[]
  /** Total condensation rate over all planes, kg/(m²·s); 0 when none. */
  rate: number
  /** Vapour flux entering from the inside and leaving to the outside, kg/(m²·s). */
  fluxIn: number
  fluxOut: number
  totalSd: number
  surfaceCondensation: { inside: boolean, outside: boolean }
  notes: string[]
  caution: string
  standard: string[]
}

function surfaceNotes(ss: SteadyState): string[] {
  const notes: string[] = []
  if (ss.surfaceInside) notes.push('The inside air is above saturation at the inside surface: surface condensation, which this interstitial method does not assess; the line starts at saturation.')
  if (ss.surfaceOutside) notes.push('The outside air is above saturation at the outside surface; the line ends at saturation.')
  return notes
}

/**
 * Steady-state interstitial condensation by the Glaser method of EN ISO 13788:2012 §6 for one set of inside and
 * outside conditions: temperature and saturation pressure at each interface, the vapour-pressure line against
 * cumulative sd, the condensation plane(s) and gc = δ0·[(pi − pc)/sd,i→c − (pc − pe)/sd,c→e] summed over them.
 */
export function condensationAt(input: CondensationAtInput): CondensationAtResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the build-up and the conditions')
  const wall = resolveWall(input.layers, input.rsi, input.rse)
  const inside = climatePoint('inside', input.inside)
  const outside = climatePoint('outside', input.outside)
  const conditions = {
    tempIn: inside.tempC,
    tempOut: outside.tempC,
    pIn: inside.rhPercent / 100 * saturationPressure(inside.tempC),
    pOut: outside.rhPercent / 100 * saturationPressure(outside.tempC),
  }
  const ss = steadyState(wall, conditions, new Set())
  const planeRates = ss.profile.vertices.filter(v => v.rate > RATE_EPSILON)
  return {
    interfaces: ss.tempC.map((t, i) => ({ index: i, tempC: t, psat: ss.psat[i]!, p: ss.profile.p[i]!, sd: wall.s[i]! })),
    planes: planeRates.map(v => v.index),
    planeRates,
    rate: planeRates.reduce((sum, v) => sum + v.rate, 0),
    fluxIn: ss.profile.fluxIn,
    fluxOut: ss.profile.fluxOut,
    totalSd: wall.s[wall.s.length - 1]!,
    surfaceCondensation: { inside: ss.surfaceInside, outside: ss.surfaceOutside },
    notes: surfaceNotes(ss),
    caution: MOISTURE_CAUTION,
    standard: ['EN ISO 13788:2012 §6 Glaser method (steady state)', 'Surface resistances EN ISO 6946:2017 Table 7'],
  }
}

export type MonthState = 'condensation' | 'evaporation' | 'dry'

export interface MonthResult {
  /** 1 = January. */
  month: number
  externalTempC: number
  externalRhPercent: number
  internalTempC: number
  internalP: number
  externalP: number
  /** Net change in stored condensate this month, kg/m² (+ condensed, − evaporated). */
  amount_kg_m2: number
  /** Condensate stored at the end of the month, kg/m². */
  accumulated_kg_m2: number
  /** Net mean rate this month, kg/(m²·s). */
  rate: number
  state: MonthState
  /** Interfaces that hold condensate or condense this month, with their own figures. */
  planes: { index: number, amount_kg_m2: number, accumulated_kg_m2: number }[]
}

export interface CondensationYearResult {
  /** Calendar order, January first; `accumulated_kg_m2` follows the calculation from `startMonth`. */
  months: MonthResult[]
  anyCondensation: boolean
  /** Month (1–12) the calculation starts from: the first month with condensation; null when there is none. */
  startMonth: number | null
  maxAccumulation_kg_m2: number
  maxAccumulationMonth: number | null
  /** Condensate left after twelve months from the start month, kg/m². */
  finalAccumulation_kg_m2: number
  /** True when no condensate remains at the end of the twelve months (or none ever forms). */
  driesOut: boolean
  /** Month (1–12) in which the stored condensate has all evaporated; null if it never forms or never dries. */
  dryMonth: number | null
  assumptions: string[]
  notes: string[]
  caution: string
  standard: string[]
}

/**
 * Internal vapour pressure for a month, Pa. With a humidity class, EN ISO 13788:2012 (internal humidity classes,
 * informative annex [recalled — verify]): pi = pe + 1.10·Δp, Δp the class excess at θe ≤ 0 °C falling linearly
 * to 0 at θe = 20 °C.
 */
export function internalVapourPressure(internal: CondensationYearInput['internal'], outside: ClimatePoint): number {
  const pe = outside.rhPercent / 100 * saturationPressure(outside.tempC)
  if ('humidityClass' in internal && internal.humidityClass !== undefined) {
    const cls = internal.humidityClass
    if (!Number.isInteger(cls) || cls < 1 || cls > 5) throw new CalcInputError('internal.humidityClass', 'The humidity class must be 1, 2, 3, 4 or 5')
    const excess = HUMIDITY_CLASS_EXCESS[cls - 1]! * Math.min(1, Math.max(0, (20 - outside.tempC) / 20))
    return pe + HUMIDITY_CLASS_FACTOR * excess
  }
  const rh = requireRange('internal.rhPercent', (internal as { rhPercent?: unknown }).rhPercent, 0, 100)
  return rh / 100 * saturationPressure(internal.tempC)
}

/**
 * Monthly interstitial condensation assessment of EN ISO 13788:2012 §6: the Glaser profile month by month,
 * starting from the first month with condensation after one without; a plane holding condensate stays at
 * saturation, so later months either add to it or evaporate it (never below zero). Reports the largest
 * accumulation and whether all of it evaporates within the twelve months.
 */
export function condensationYear(input: CondensationYearInput): CondensationYearResult {
  if (input === null || typeof input !== 'object') throw new CalcInputError('input', 'Give the build-up, the climate and the internal conditions')
  const wall = resolveWall(input.layers, input.rsi, input.rse)
  if (!Array.isArray(input.climate) || input.climate.length !== 12) {
    throw new CalcInputError('climate', 'Give twelve months of outside climate, January first')
  }
  const climate = input.climate.map((c, i) => climatePoint(`climate[${i}]`, c))
  const internal = input.internal
  if (internal === null || typeof internal !== 'object') throw new CalcInputError('internal', 'Give the internal conditions')
  const tempIn = requireRange('internal.tempC', internal.tempC, TEMP_MIN, TEMP_MAX)
  const notes: string[] = []

  const conditions: Conditions[] = climate.map((c, m) => {
    const pSat = saturationPressure(tempIn)
    let pIn = internalVapourPressure(internal, c)
    if (pIn > pSat) {
      notes.push(`Month ${m + 1}: the humidity class gives an internal vapour pressure above saturation; it is limited to 100 % RH.`)
      pIn = pSat
    }
    return { tempIn, tempOut: c.tempC, pIn, pOut: c.rhPercent / 100 * saturationPressure(c.tempC) }
  })

  const condensesDry = conditions.map(c => steadyState(wall, c, new Set()).profile.vertices.some(v => v.rate > RATE_EPSILON))
  const anyCondensation = condensesDry.some(Boolean)
  let start = condensesDry.findIndex((c, m) => c && !condensesDry[(m + 11) % 12])
  if (start < 0) start = 0

  const stored = new Map<number, number>()
  const months = new Array<MonthResult>(12)
  let maxAccumulation = 0
  let maxMonth: number | null = null
  let dryMonth: number | null = null
  for (let k = 0; k < 12; k++) {
    const m = (start + k) % 12
    const seconds = DAYS_IN_MONTH[m]! * 86400
    const ss = steadyState(wall, conditions[m]!, new Set(stored.keys()))
    if (ss.surfaceInside) notes.push(`Month ${m + 1}: surface condensation on the inside face, not assessed by this method.`)
    const wasWet = stored.size > 0
    const planes: MonthResult['planes'] = []
    for (const v of ss.profile.vertices) {
      const before = stored.get(v.index) ?? 0
      if (before === 0 && v.rate <= RATE_EPSILON) continue
      const after = Math.max(0, before + v.rate * seconds)
      if (after > 0) stored.set(v.index, after)
      else stored.delete(v.index)
      planes.push({ index: v.index, amount_kg_m2: after - before, accumulated_kg_m2: after })
    }
    const amount = planes.reduce((sum, p) => sum + p.amount_kg_m2, 0)
    const accumulated = [...stored.values()].reduce((sum, x) => sum + x, 0)
    if (accumulated > maxAccumulation) {
      maxAccumulation = accumulated
      maxMonth = m + 1
    }
    if (wasWet && stored.size === 0 && dryMonth === null) dryMonth = m + 1
    const c = climate[m]!
    months[m] = {
      month: m + 1,
      externalTempC: c.tempC,
      externalRhPercent: c.rhPercent,
      internalTempC: tempIn,
      internalP: conditions[m]!.pIn,
      externalP: conditions[m]!.pOut,
      amount_kg_m2: amount,
      accumulated_kg_m2: accumulated,
      rate: amount / seconds,
      state: amount > 0 ? 'condensation' : amount < 0 ? 'evaporation' : 'dry',
      planes,
    }
  }
  const finalAccumulation = [...stored.values()].reduce((sum, x) => sum + x, 0)
  const driesOut = finalAccumulation === 0
  if (!driesOut) notes.push('Condensate remains after twelve months, so it would build up year on year: the build-up fails this assessment.')
  else if (anyCondensation) notes.push('Condensate forms and evaporates within the year; check the largest amount against what the material at the plane can hold without harm.')

  const humidity = 'humidityClass' in internal && internal.humidityClass !== undefined
    ? `Internal humidity class ${internal.humidityClass} (EN ISO 13788:2012, excess vapour pressure × 1.10)`
    : `Internal relative humidity ${(internal as { rhPercent: number }).rhPercent} % held constant`
  return {
    months,
    anyCondensation,
    startMonth: anyCondensation ? start + 1 : null,
    maxAccumulation_kg_m2: maxAccumulation,
    maxAccumulationMonth: maxMonth,
    finalAccumulation_kg_m2: finalAccumulation,
    driesOut,
    dryMonth: driesOut ? dryMonth : null,
    assumptions: [
      `Internal temperature ${tempIn} °C all year`,
      humidity,
      'Monthly mean outside temperature and humidity as entered; the climate data source is the user\'s',
      'Month lengths of a common year (February 28 days)',
    ],
    notes: [...new Set(notes)],
    caution: MOISTURE_CAUTION,
    standard: ['EN ISO 13788:2012 §6 monthly method (Glaser)', 'Surface resistances EN ISO 6946:2017 Table 7'],
  }
}
