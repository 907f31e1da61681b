import { signInSchema } from '../../../shared/schemas/auth'
import { User } from '../../models'

// A hash of a random password, verified against when the e-mail is unknown so both answers take as long.
let decoyHash: Promise<string> | null = null

export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { email, password } = await readValidatedBody(event, parseWith(signInSchema))
  const ip = clientAddress(event)
  useDb()
  await assertNotLockedOut(event, email, ip)

  const user = await User.findOne({ where: { email } })
  decoyHash ??= hashPassword(`decoy-${Math.random()}`)
  const valid = user?.passwordHash
    ? await verifyPassword(user.passwordHash, password)
    : (await verifyPassword(await decoyHash, password), false)

  if (!user || !valid || user.deactivatedAt) {
    await recordAttempt(email, ip, false)
    await recordAudit(event, { actorUserId: user?.id ?? null, action: 'sign-in.failed', subjectType: 'user', subjectId: user?.id, detail: { email } })
    throw createError({ statusCode: 401, statusMessage: 'Sign-in failed', message: 'That e-mail and password do not match an active account.' })
  }
  if (!user.emailVerifiedAt) {
    // The password was right, so saying why is no leak: the person needs to know to open the mail.
    throw createError({ statusCode: 403, statusMessage: 'E-mail not confirmed', message: 'Confirm your e-mail address first: open the link in the message we sent you.' })
  }
  if (passwordNeedsReHash(user.passwordHash!)) user.passwordHash = await hashPassword(password)
  user.lastSignInAt = new Date()
  await user.save()
  await recordAttempt(email, ip, true)
  await recordAudit(event, { actorUserId: user.id, action: 'sign-in', subjectType: 'user', subjectId: user.id })

  const sessionUser = { id: user.id, name: user.name, email: user.email, role: user.role, organisationId: user.organisationId ?? null }
  await replaceUserSession(event, { user: sessionUser, signedInAt: Date.now() })
  return { user: sessionUser }
})
