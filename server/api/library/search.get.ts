import { librarySearchQuerySchema } from '../../../shared/library/inputs'

/** Searches the detail library (public). With no words it lists the library, filtered, in code order. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const query = await getValidatedQuery(event, parseWith(librarySearchQuerySchema))
  const { total, results } = await searchLibrary(event, query)
  return { q: query.q, total, results }
})
