import { libraryCodeParamsSchema } from '../../../../../shared/library/inputs'

/** The item's printable sheet as a PDF download (public). */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { code } = await getValidatedRouterParams(event, parseWith(libraryCodeParamsSchema))
  const item = await getLibraryItem(event, code)
  if (!item) notFound('library item')
  const pdf = await renderLibrarySheet(event, item)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${item.code}-rev-${item.revision}.pdf"`,
    'content-length': pdf.length,
    'cache-control': 'no-store',
  })
  return pdf
})
