/**
 * The wind-and-anchors method of the workbench: one facade, from the basic wind velocity to anchor counts per
 * zone. It only strings the engine together (peakVelocityPressure → wallPressureCoefficients → anchorLayout);
 * every formula lives in shared/calc/wind.ts.
 */
import { z } from 'zod'
import { anchorLayout, peakVelocityPressure, wallPressureCoefficients, WIND_ENGINEER_CAUTION } from '../calc/wind'
import type { AnchorLayoutResult, PeakVelocityPressureResult, WallPressureCoefficientsResult } from '../calc/wind'
import { anchorLayoutInput, anchorsPerM2Input, peakVelocityPressureInput, wallPressureCoefficientsInput } from '../calc/schemas2'

export const windAnchorsSchema = z.object({
  vb: peakVelocityPressureInput.shape.vb,
  terrain: peakVelocityPressureInput.shape.terrain,
  co: peakVelocityPressureInput.shape.co,
  /** Length of the facade being anchored (m). */
  facadeLength_m: z.number({ error: 'Facade length must be a number' }).gt(0, 'Facade length must be greater than zero').max(500, 'Facade length must be at most 500 m'),
  /** The building's other plan dimension (m). */
  depth_m: z.number({ error: 'Building depth must be a number' }).gt(0, 'Building depth must be greater than zero').max(500, 'Building depth must be at most 500 m'),
  storeys: z.number({ error: 'Storeys must be a number' }).int('Storeys must be whole').min(1, 'At least one storey').max(60, 'At most 60 storeys'),
  storeyHeight_m: z.number({ error: 'Storey height must be a number' }).gt(0, 'Storey height must be greater than zero').max(10, 'Storey height must be at most 10 m'),
  /** Tributary area of one anchor, for cpe (m²); below 1 m² cpe,1 applies. */
  loadedArea_m2: wallPressureCoefficientsInput.shape.loadedArea_m2,
  /** Share of the facade taken by openings (%), deducted evenly from every zone. */
  openingsPercent: z.number({ error: 'Openings must be a number' }).min(0, 'Openings cannot be negative').max(90, 'Openings must be at most 90 %').optional(),
  anchorResistance_kN: anchorsPerM2Input.shape.anchorResistance_kN,
  gammaQ: anchorsPerM2Input.shape.gammaQ,
  minimumPerM2: anchorsPerM2Input.shape.minimumPerM2,
  patterns: anchorLayoutInput.shape.patterns,
})
export type WindAnchorsInput = z.infer<typeof windAnchorsSchema>

export interface FacadeStrip {
  zone: 'A' | 'B' | 'C'
  /** From and to, measured along the facade from its left end (m). */
  from_m: number
  to_m: number
}

export interface FacadeZone {
  zone: 'A' | 'B' | 'C'
  /** cpe of the zone for wind along the facade. */
  cpeAlong: number
  /** cpe used: the more severe of cpeAlong and the leeward suction E when the wind blows onto the opposite face. */
  cpe: number
  governedBy: 'side-zone' | 'leeward-E'
  grossArea_m2: number
  netArea_m2: number
}

export interface WindAnchorsResult {
  h_m: number
  /** Reference height used for qp: the top of the facade. */
  z_m: number
  pressure: PeakVelocityPressureResult
  /** Zones for wind parallel to the facade (A–C on it, D/E on the end walls). */
  along: WallPressureCoefficientsResult
  /** Zones for wind onto the opposite face, for the leeward suction E on this facade. */
  across: WallPressureCoefficientsResult
  strips: FacadeStrip[]
  zones: FacadeZone[]
  layout: AnchorLayoutResult
  assumptions: string[]
  caution: string
}

const severity = { A: 3, B: 2, C: 1 } as const

/**
 * Anchors for one facade of a rectangular building — EN 1991-1-4 §4.5 (qp), §7.2.2 (zones A–E) and the anchor
 * check of shared/calc/wind.ts. Wind from either end mirrors the side zones, so each point of the facade takes the
 * more severe zone of the two directions; each zone's cpe is then compared with the leeward E of the wind onto the
 * opposite face, and the more severe is used.
 */
export function windAnchors(input: WindAnchorsInput): WindAnchorsResult {
  const h = input.storeys * input.storeyHeight_m
  const L = input.facadeLength_m
  const pressure = peakVelocityPressure({ vb: input.vb, z: h, terrain: input.terrain, co: input.co })
  const along = wallPressureCoefficients({ b: input.depth_m, d: L, h, loadedArea_m2: input.loadedArea_m2 })
  const across = wallPressureCoefficients({ b: L, d: input.depth_m, h, loadedArea_m2: input.loadedArea_m2 })
  const leewardE = across.zones.find((z) => z.zone === 'E')!.cpe

  // Clip each side zone to the half facade nearer its windward corner, then mirror it onto the other half.
  const half = L / 2
  const left: FacadeStrip[] = []
  for (const z of along.zones) {
    if (z.face !== 'side') continue
    const from = Math.min(z.start_m, half)
    const to = Math.min(z.start_m + z.width_m, half)
    if (to > from) left.push({ zone: z.zone as FacadeStrip['zone'], from_m: from, to_m: to })
  }
  const strips = [...left, ...left.slice().reverse().map((s) => ({ zone: s.zone, from_m: L - s.to_m, to_m: L - s.from_m }))]
  // Strips that meet at the middle in the same zone read better as one.
  const merged: FacadeStrip[] = []
  for (const s of strips) {
    const last = merged.at(-1)
    if (last && last.zone === s.zone && Math.abs(last.to_m - s.from_m) < 1e-9) last.to_m = s.to_m
    else merged.push({ ...s })
  }

  const openings = (input.openingsPercent ?? 0) / 100
  const zones: FacadeZone[] = (['A', 'B', 'C'] as const)
    .filter((zone) => merged.some((s) => s.zone === zone))
    .map((zone) => {
      const cpeAlong = along.zones.find((z) => z.zone === zone)!.cpe
      const leewardGoverns = leewardE < cpeAlong
      const gross = merged.filter((s) => s.zone === zone).reduce((sum, s) => sum + (s.to_m - s.from_m) * h, 0)
      return {
        zone,
        cpeAlong,
        cpe: leewardGoverns ? leewardE : cpeAlong,
        governedBy: leewardGoverns ? ('leeward-E' as const) : ('side-zone' as const),
        grossArea_m2: gross,
        netArea_m2: gross * (1 - openings),
      }
    })
    .sort((a, b) => severity[b.zone] - severity[a.zone])

  const layout = anchorLayout({
    qp: pressure.qp,
    anchorResistance_kN: input.anchorResistance_kN,
    gammaQ: input.gammaQ,
    minimumPerM2: input.minimumPerM2,
    patterns: input.patterns,
    zones: zones.map((z) => ({ zone: z.zone, area_m2: z.netArea_m2, cpe: z.cpe })),
  })

  return {
    h_m: h,
    z_m: h,
    pressure,
    along,
    across,
    strips: merged,
    zones,
    layout,
    assumptions: [
      `Building height h = ${input.storeys} storeys × ${input.storeyHeight_m} m = ${h.toFixed(2)} m; qp taken at ze = h for the whole facade (conservative).`,
      'Rectangular plan, flat-topped; no funnelling, no neighbouring tall buildings (EN 1991-1-4 §7.2.2 scope).',
      'Wind along the facade from either end: both ends take zone A, the middle the least severe zone.',
      `Openings deducted evenly from every zone: ${input.openingsPercent ?? 0} %.`,
      `γQ = ${input.gammaQ ?? 1.5} (EN 1990 recommended) and a system minimum of ${input.minimumPerM2 ?? 6} anchors/m² (common practice) unless entered.`,
    ],
    caution: WIND_ENGINEER_CAUTION,
  }
}
