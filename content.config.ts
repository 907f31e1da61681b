import { defineCollection, defineContentConfig } from '@nuxt/content'
import { clauseSchema, detailSchema, guidanceSchema } from './shared/library/schemas'

// The department's library: one collection per kind of item, each validated by the same zod schema the
// content test walks (shared/library/schemas.ts).
export default defineContentConfig({
  collections: {
    details: defineCollection({ type: 'page', source: 'details/*.md', schema: detailSchema }),
    clauses: defineCollection({ type: 'page', source: 'clauses/*.md', schema: clauseSchema }),
    guidance: defineCollection({ type: 'page', source: 'guidance/*.md', schema: guidanceSchema }),
  },
})
