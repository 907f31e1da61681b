export default defineEventHandler(async (event) => {
  const caller = await publicRoute(event)
  await clearUserSession(event)
  if (caller) await recordAudit(event, { actorUserId: caller.id, action: 'sign-out', subjectType: 'user', subjectId: caller.id })
  return { signedOut: true }
})
