import { z } from 'zod'
import { itemStatusSchema, junctionTypeSchema } from './schemas'
import { anyCodePattern, libraryCollections } from './terms'

/** Inputs of the library's routes, shared by the pages that send them and the routes that check them. */

export const libraryCollectionSchema = z.enum(libraryCollections)

/** A code in the URL; written in any case, answered in capitals. */
export const libraryCodeSchema = z
  .string()
  .trim()
  .transform(s => s.toUpperCase())
  .pipe(z.string().regex(anyCodePattern, 'not a library code (codes look like D-WIN-03, C-ETICS-12 or G-AIR-01)'))

export const libraryCodeParamsSchema = z.object({ code: libraryCodeSchema })

// An empty select in a form sends "": treat it as "no filter".
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(v => (v === '' ? undefined : v), schema.optional())

export const librarySearchQuerySchema = z.object({
  q: z.string().max(200, 'the search may be at most 200 characters').default(''),
  collection: optional(libraryCollectionSchema),
  junctionType: optional(junctionTypeSchema),
  status: optional(itemStatusSchema),
  limit: z.coerce.number().int().min(1).max(200).default(50),
})
export type LibrarySearchQuery = z.infer<typeof librarySearchQuerySchema>

export const librarySuggestBodySchema = z.object({
  text: z.string().trim().min(3, 'give at least a few words to suggest from').max(20_000),
  limit: z.number().int().min(1).max(20).default(8),
})

/** A manager's mark: superseded by the successor, or `null` to take the mark away again. */
export const librarySupersedeBodySchema = z.object({
  successor: z.union([libraryCodeSchema, z.null()], { error: 'name the successor by its code, or null to clear the mark' }),
})
export type LibrarySupersedeBody = z.infer<typeof librarySupersedeBodySchema>
