import { z } from 'zod'
import { anyCodePattern } from '../library/terms'

/**
 * Response packs: the inputs of their routes, the policy that asks for a second officer's check, and the
 * cautions a pack carries. Shared by the composer (which previews both) and the server (which decides).
 */

export const packStatuses = ['draft', 'awaiting-check', 'issued'] as const
export type PackStatus = typeof packStatuses[number]
export const packStatusLabels: Record<PackStatus, string> = {
  'draft': 'Draft',
  'awaiting-check': 'Awaiting check',
  'issued': 'Issued',
}

export const packInputSchema = z.object({
  replyBody: z.string().trim().min(1, 'Write the reply text').max(20_000, 'The reply is too long (20,000 characters at most)'),
  items: z.array(
    z.string().trim().transform(s => s.toUpperCase()).pipe(z.string().regex(anyCodePattern, 'not a library code (codes look like D-WIN-03)')),
  ).max(20, 'At most 20 library items in one pack').default([]),
  calculationIds: z.array(z.number().int().positive('not a calculation id')).max(20, 'At most 20 calculations in one pack').default([]),
  quotationIds: z.array(z.number().int().positive('not a quotation id')).max(5, 'At most 5 quotations in one pack').default([]),
  checkerId: z.number().int().positive().nullable().optional(),
}).refine(v => new Set(v.items).size === v.items.length, { path: ['items'], message: 'An item is listed twice' })
  .refine(v => new Set(v.calculationIds).size === v.calculationIds.length, { path: ['calculationIds'], message: 'A calculation is listed twice' })
  .refine(v => new Set(v.quotationIds).size === v.quotationIds.length, { path: ['quotationIds'], message: 'A quotation is listed twice' })
export type PackInput = z.infer<typeof packInputSchema>

export const packIdParamsSchema = z.object({ id: z.coerce.number().int().positive('Not a valid pack id') })

/** Topics whose answers a second officer checks before they go out: a wrong answer there can hurt someone. */
export const checkedTopics = ['structure', 'wind', 'fire'] as const

export function packNeedsCheck(topic: string): boolean {
  return (checkedTopics as readonly string[]).includes(topic)
}

export type CautionKind = 'structure' | 'fire' | 'wind' | 'general'

export const packCautionTexts: Record<CautionKind, { title: string, text: string }> = {
  structure: {
    title: 'Structure',
    text: 'Anything in this pack that bears on structure (walls, lintels, restraint, bearings, foundations) is guidance '
      + 'for the demonstration system only. A chartered structural engineer confirms the structural design of the '
      + 'project under its local regulations before it is built.',
  },
  fire: {
    title: 'Fire',
    text: 'Nothing in this pack states that a wall, barrier or product passes a fire requirement. A fire engineer '
      + 'confirms the fire strategy and the classification of every element against the local regulations that apply '
      + 'to the building.',
  },
  wind: {
    title: 'Wind load on fixings',
    text: 'Wind pressures, anchor numbers and fixing patterns in this pack are indicative. A chartered engineer '
      + 'confirms the wind load on the building and the design of the fixings for the site, its exposure and the '
      + 'building\'s height.',
  },
  general: {
    title: 'Indicative advice',
    text: 'This pack is indicative technical advice for the project as described to us. It is not a compliance '
      + 'certificate, and a competent designer confirms the design under the local regulations. Corrstone Building '
      + 'Systems Ltd is an invented demonstration company and all its data is invented.',
  },
}

// Which calculation methods bear on which risk: wind and anchor methods on wind load, masonry methods on structure.
const methodKinds: Array<[RegExp, CautionKind]> = [
  [/wind|anchor|fixing/i, 'wind'],
  [/masonry|wall-capacity|strength|lintel|structur/i, 'structure'],
  [/fire/i, 'fire'],
]
// Library items by their code's section and their tags.
const itemKinds: Array<[RegExp, CautionKind]> = [
  [/^[DCG]-FIR-|(^|\s)fire(\s|$)/i, 'fire'],
  [/^[DCG]-ANC-|wind|anchor|fixings/i, 'wind'],
  [/^[DCG]-(MAS|BEA)-|structur|restraint|lintel|bearing|foundation/i, 'structure'],
]

export interface CautionSubject {
  topic: string
  calculationMethods: string[]
  items: Array<{ code: string, tags: string[] }>
}

/**
 * The cautions a pack carries: one for each kind of risk its topic, calculations or library items touch,
 * and always the general one, last.
 */
export function packCautionKinds(subject: CautionSubject): CautionKind[] {
  const kinds = new Set<CautionKind>()
  if (packNeedsCheck(subject.topic)) kinds.add(subject.topic as CautionKind)
  for (const m of subject.calculationMethods) {
    for (const [pattern, kind] of methodKinds) if (pattern.test(m)) kinds.add(kind)
  }
  for (const item of subject.items) {
    for (const [pattern, kind] of itemKinds) {
      if (pattern.test(item.code) || item.tags.some(t => pattern.test(t))) kinds.add(kind)
    }
  }
  const order: CautionKind[] = ['structure', 'fire', 'wind']
  return [...order.filter(k => kinds.has(k)), 'general']
}

/** Revision letters A, B, … Z in order; a 27th issue is refused rather than given a letter out of the scheme. */
export function nextPackRevision(previous: string | null): string {
  if (!previous) return 'A'
  if (previous >= 'Z') throw new Error('A pack can be re-issued at most 26 times (revisions A to Z).')
  return String.fromCharCode(previous.charCodeAt(0) + 1)
}
