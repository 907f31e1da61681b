import { libraryCodeParamsSchema } from '../../../../../shared/library/inputs'

/** The detail's drawing as an SVG download (public); items without a drawing answer 404. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { code } = await getValidatedRouterParams(event, parseWith(libraryCodeParamsSchema))
  const item = await getLibraryItem(event, code)
  if (!item?.drawing) notFound('drawing')
  const svg = await readLibraryDrawing(item.drawing)
  setResponseHeaders(event, {
    'content-type': 'image/svg+xml; charset=utf-8',
    'content-disposition': `attachment; filename="${item.code}-rev-${item.revision}.svg"`,
    'x-content-type-options': 'nosniff',
  })
  return svg
})
