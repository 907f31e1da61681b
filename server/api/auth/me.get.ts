/** The signed-in person as the server knows them now (null for the public). */
export default defineEventHandler(async (event) => {
  const caller = await publicRoute(event)
  return { user: caller }
})
