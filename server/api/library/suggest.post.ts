import { librarySuggestBodySchema } from '../../../shared/library/inputs'

/** Details and clauses likely to answer a free text, e.g. an enquiry's topic, question and project (staff). */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  const { text, limit } = await readValidatedBody(event, parseWith(librarySuggestBodySchema))
  return { suggestions: await suggestForText(event, text, limit) }
})
