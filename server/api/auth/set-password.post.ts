import { setPasswordSchema } from '../../../shared/schemas/auth'

/** Spends a reset or invitation token. An invitation also confirms the address it was sent to. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { token, password } = await readValidatedBody(event, parseWith(setPasswordSchema))
  const db = useDb()
  const passwordHash = await hashPassword(password)
  await db.transaction(async (transaction) => {
    const { user, purpose } = await consumeToken(token, ['reset-password', 'invitation'], transaction)
    user.passwordHash = passwordHash
    user.emailVerifiedAt ??= new Date()
    await user.save({ transaction })
    await recordAudit(event, { actorUserId: user.id, action: purpose === 'invitation' ? 'invitation.accepted' : 'password.reset', subjectType: 'user', subjectId: user.id }, transaction)
  })
  return { message: 'Your password is set. You can sign in now.' }
})
