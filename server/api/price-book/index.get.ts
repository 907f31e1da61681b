/** The price book: products, labour rates and delivery zones, for staff. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  return { items: await loadPriceBook() }
})
