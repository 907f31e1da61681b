import { tokenSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { token } = await readValidatedBody(event, parseWith(tokenSchema))
  const db = useDb()
  await db.transaction(async (transaction) => {
    const { user } = await consumeToken(token, ['verify-email'], transaction)
    user.emailVerifiedAt ??= new Date()
    await user.save({ transaction })
    await recordAudit(event, { actorUserId: user.id, action: 'email.verified', subjectType: 'user', subjectId: user.id }, transaction)
  })
  return { message: 'Your e-mail address is confirmed. You can sign in now.' }
})
