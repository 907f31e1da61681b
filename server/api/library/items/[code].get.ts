import { libraryCodeParamsSchema } from '../../../../shared/library/inputs'

/** One library item with its drawing link, key values, body, history and related items (public). */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { code } = await getValidatedRouterParams(event, parseWith(libraryCodeParamsSchema))
  const item = await getLibraryItem(event, code)
  if (!item) notFound('library item')
  return item
})
