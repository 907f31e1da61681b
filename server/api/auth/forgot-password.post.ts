import { forgotPasswordSchema } from '../../../shared/schemas/auth'
import { User } from '../../models'

/** Always the same answer, so the form cannot be used to find out who has an account. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  const { email } = await readValidatedBody(event, parseWith(forgotPasswordSchema))
  rateLimit(event, accountMailLimit('account:forgot-password'))
  const db = useDb()
  await db.transaction(async (transaction) => {
    const user = await User.findOne({ where: { email }, transaction })
    if (!user || user.deactivatedAt) return
    const token = await issueToken(user.id, 'reset-password', transaction)
    const mail = accountMails.resetPassword(user.name, `${useRuntimeConfig().siteUrl}/account/set-password?token=${token}`)
    await queueMail({ kind: 'account', to: user.email, ...mail }, transaction)
  })
  setResponseStatus(event, 202)
  return { message: 'If that address has an account, a link to set a new password is on its way.' }
})
