import { registerSchema } from '../../../shared/schemas/auth'
import { Organisation, User } from '../../models'

/**
 * Self-registration for specifiers. A new registrant always gets an organisation record of their own:
 * joining an existing organisation by typing its name would open that firm's enquiries to anyone, so an
 * admin merges duplicates instead. The answer is the same whether or not the address already has an account.
 */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const input = await readValidatedBody(event, parseWith(registerSchema))
  rateLimit(event, accountMailLimit('account:register'))
  const db = useDb()
  const siteUrl = useRuntimeConfig().siteUrl

  await db.transaction(async (transaction) => {
    const existing = await User.findOne({ where: { email: input.email }, transaction })
    if (existing) {
      const token = await issueToken(existing.id, 'reset-password', transaction)
      const mail = accountMails.alreadyRegistered(existing.name, `${siteUrl}/account/set-password?token=${token}`)
      await queueMail({ kind: 'account', to: existing.email, ...mail }, transaction)
      return
    }
    const organisation = await Organisation.create({ name: input.organisationName, kind: input.organisationKind, mergedIntoId: null }, { transaction })
    const user = await User.create({
      email: input.email,
      name: input.name,
      passwordHash: await hashPassword(input.password),
      role: 'specifier',
      organisationId: organisation.id,
      phone: input.phone || null,
      emailVerifiedAt: null,
      deactivatedAt: null,
      lastSignInAt: null,
    }, { transaction })
    const token = await issueToken(user.id, 'verify-email', transaction)
    const mail = accountMails.verifyEmail(user.name, `${siteUrl}/account/verify?token=${token}`)
    await queueMail({ kind: 'account', to: user.email, ...mail }, transaction)
    await recordAudit(event, { actorUserId: user.id, action: 'register', subjectType: 'user', subjectId: user.id }, transaction)
  })

  setResponseStatus(event, 202)
  return { message: 'Check your inbox: we have sent a link to confirm your e-mail address.' }
})
