/** Library items sent in packs on open enquiries that have since been superseded or revised (staff only). */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  return { items: await staleItemsOnOpenEnquiries(event) }
})
