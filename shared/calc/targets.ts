import { CalcInputError, requirePositive } from './errors'

export type TargetElement = 'wall' | 'roof' | 'floor' | 'window-door'

export interface UTarget {
  id: string
  jurisdiction: 'Ireland' | 'England'
  document: string
  element: TargetElement
  /** Maximum U, W/m²K. */
  u: number
  basis: string
  source: `published: ${string}` | `recalled: ${string}`
}

/** Regulatory U-value targets the workbench checks against (for new dwellings). */
export const U_TARGETS: readonly UTarget[] = [
  {
    id: 'ie-tgdl-2019-wall', jurisdiction: 'Ireland', document: 'Technical Guidance Document L 2019', element: 'wall', u: 0.18,
    basis: 'New dwellings, maximum elemental U of walls',
    source: 'published: TGD L 2019 Table 1, summarised by building-regulation guides',
  },
  {
    id: 'ie-tgdl-2019-roof', jurisdiction: 'Ireland', document: 'Technical Guidance Document L 2019', element: 'roof', u: 0.16,
    basis: 'New dwellings, maximum elemental U of roofs',
    source: 'published: TGD L 2019 Table 1, summarised by building-regulation guides',
  },
  {
    id: 'ie-tgdl-2019-floor', jurisdiction: 'Ireland', document: 'Technical Guidance Document L 2019', element: 'floor', u: 0.18,
    basis: 'New dwellings, maximum elemental U of ground and exposed floors',
    source: 'published: TGD L 2019 Table 1, summarised by building-regulation guides',
  },
  {
    id: 'ie-tgdl-2019-window-door', jurisdiction: 'Ireland', document: 'Technical Guidance Document L 2019', element: 'window-door', u: 1.4,
    basis: 'New dwellings, maximum elemental U of windows and doors',
    source: 'published: TGD L 2019 Table 1, summarised by building-regulation guides',
  },
  {
    id: 'en-adl-2021-wall-limiting', jurisdiction: 'England', document: 'Approved Document L 2021, Volume 1', element: 'wall', u: 0.26,
    basis: 'New dwellings, limiting U of walls (the worst any wall may be)',
    source: 'recalled: Approved Document L 2021 Volume 1, limiting fabric standards',
  },
  {
    id: 'en-adl-2021-wall-notional', jurisdiction: 'England', document: 'Approved Document L 2021, Volume 1', element: 'wall', u: 0.18,
    basis: 'Notional dwelling wall: the U the target emission rate is built on',
    source: 'recalled: Approved Document L 2021 Volume 1, notional dwelling specification',
  },
]

export const TARGET_CAUTION
  = 'The targets are shown for orientation. Compliance is shown through the whole-building method of the '
    + 'regulations in force, checked by a competent designer; a single U-value meeting a figure is not compliance.'

export interface TargetCheck {
  target: UTarget
  u: number
  /** True when the unrounded U is at or below the target. */
  meets: boolean
  /** Target minus U, W/m²K: positive when there is headroom. */
  margin: number
  caution: string
}

/** The targets for one element, in the order listed. */
export function targetsFor(element: TargetElement): UTarget[] {
  return U_TARGETS.filter(t => t.element === element)
}

/**
 * Compares a U-value with a regulatory target. The unrounded U is compared, so a value that only rounds to the
 * target is reported as above it.
 */
export function checkTarget(u: number, targetId: string): TargetCheck {
  const value = requirePositive('u', u)
  const target = U_TARGETS.find(t => t.id === targetId)
  if (!target) throw new CalcInputError('targetId', `Unknown U-value target "${targetId}"`)
  return { target, u: value, meets: value <= target.u, margin: target.u - value, caution: TARGET_CAUTION }
}
