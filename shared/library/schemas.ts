import { z } from 'zod'
import { anyCodePattern, clauseCodePattern, detailCodePattern, guidanceCodePattern, itemStatuses, junctionTypes } from './terms'
import type { ItemStatus, LibraryCollection } from './terms'

/**
 * Front-matter schemas for the three library collections (details, clauses, guidance).
 * The same schemas serve the content configuration, the server's search index and the tests
 * that walk the content folders, so a field is named and checked in one place only.
 */

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'date must be written YYYY-MM-DD')
  .refine(s => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'not a calendar date')

const revisionLetter = z.string().regex(/^[A-Z]$/, 'revision is a single capital letter')

const anyCode = z.string().regex(anyCodePattern, 'code must look like D-WIN-03, C-ETICS-12 or G-AIR-01')

export const revisionEntrySchema = z.object({
  revision: revisionLetter,
  date: isoDate,
  note: z.string().min(3),
})
export type RevisionEntry = z.infer<typeof revisionEntrySchema>

export const junctionTypeSchema = z.enum(junctionTypes)

export const itemStatusSchema = z.enum(itemStatuses)

function commonShape(codePattern: RegExp, example: string) {
  return {
    code: z.string().regex(codePattern, `code must follow the pattern of ${example}`),
    title: z.string().min(3).max(140),
    revision: revisionLetter,
    revisionDate: isoDate,
    status: itemStatusSchema,
    supersededBy: anyCode.optional(),
    tags: z.array(z.string().min(1)).min(1),
    summary: z.string().min(10).max(400),
    revisions: z.array(revisionEntrySchema).min(1),
    related: z.array(anyCode).default([]),
  }
}

interface CommonFields {
  code: string
  revision: string
  revisionDate: string
  status: ItemStatus
  supersededBy?: string
  revisions: RevisionEntry[]
  related: string[]
}

/**
 * Rules that tie the common fields together: a superseded item names its successor (and only a
 * superseded one does), the history ends at the current revision letter and date, letters rise.
 */
function checkCommon(item: CommonFields, ctx: z.RefinementCtx) {
  if (item.status === 'superseded' && !item.supersededBy) {
    ctx.addIssue({ code: 'custom', path: ['supersededBy'], message: 'a superseded item must name its successor in supersededBy' })
  }
  if (item.status === 'current' && item.supersededBy) {
    ctx.addIssue({ code: 'custom', path: ['supersededBy'], message: 'only a superseded item may name a successor' })
  }
  if (item.supersededBy === item.code) {
    ctx.addIssue({ code: 'custom', path: ['supersededBy'], message: 'an item cannot supersede itself' })
  }
  if (item.related.includes(item.code)) {
    ctx.addIssue({ code: 'custom', path: ['related'], message: 'an item cannot be related to itself' })
  }
  const last = item.revisions.at(-1)
  if (last && (last.revision !== item.revision || last.date !== item.revisionDate)) {
    ctx.addIssue({ code: 'custom', path: ['revisions'], message: `the last revision entry must be ${item.revision} of ${item.revisionDate}` })
  }
  for (let i = 1; i < item.revisions.length; i++) {
    const prev = item.revisions[i - 1]!
    const cur = item.revisions[i]!
    if (cur.revision <= prev.revision) {
      ctx.addIssue({ code: 'custom', path: ['revisions', i, 'revision'], message: 'revision letters must rise through the history' })
    }
    if (cur.date < prev.date) {
      ctx.addIssue({ code: 'custom', path: ['revisions', i, 'date'], message: 'revision dates must not go backwards' })
    }
  }
}

export const detailSchema = z
  .object({
    ...commonShape(detailCodePattern, 'D-WIN-03'),
    junctionType: junctionTypeSchema,
    wallBuildUp: z.string().min(10),
    /** Linear thermal transmittance the detail was modelled at, W/mK. */
    psi: z.number().min(-0.5).max(2),
    /** Temperature factor at the internal surface, dimensionless. */
    fRsi: z.number().gt(0).lt(1),
    modelledValuesNote: z.string().regex(/invented/i, 'the note must say the values are invented demo values'),
    drawing: z.string().regex(/^[A-Za-z0-9-]+\.svg$/, 'drawing is the file name of an SVG'),
  })
  .superRefine(checkCommon)

export const clauseSchema = z
  .object({
    ...commonShape(clauseCodePattern, 'C-ETICS-12'),
    /** Specification section the clause belongs to, e.g. "Masonry units". */
    section: z.string().min(3),
  })
  .superRefine(checkCommon)

export const guidanceSchema = z
  .object({
    ...commonShape(guidanceCodePattern, 'G-AIR-01'),
  })
  .superRefine(checkCommon)

export type Detail = z.infer<typeof detailSchema>
export type Clause = z.infer<typeof clauseSchema>
export type Guidance = z.infer<typeof guidanceSchema>

export const librarySchemas = {
  details: detailSchema,
  clauses: clauseSchema,
  guidance: guidanceSchema,
} as const satisfies Record<LibraryCollection, z.ZodType>
