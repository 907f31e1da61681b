import { inviteStaffSchema } from '../../../../shared/schemas/auth'
import { roleLabels } from '../../../../shared/types/roles'
import { Organisation, User } from '../../../models'

/** An admin creates an account (usually staff) and the person receives a link to choose a password. */
export default defineEventHandler(async (event) => {
  const admin = await requireAdmin(event)
  const input = await readValidatedBody(event, parseWith(inviteStaffSchema))
  const db = useDb()
  const user = await db.transaction(async (transaction) => {
    if (await User.findOne({ where: { email: input.email }, transaction })) {
      throw createError({ statusCode: 409, statusMessage: 'Already registered', message: 'An account with that e-mail address already exists.' })
    }
    let organisationId = input.organisationId ?? null
    if (organisationId && !(await Organisation.findByPk(organisationId, { transaction }))) {
      throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'organisationId: No such organisation' })
    }
    if (!organisationId && input.role !== 'specifier') {
      organisationId = (await Organisation.findOne({ where: { kind: 'supplier' }, order: [['id', 'ASC']], transaction }))?.id ?? null
    }
    if (!organisationId && input.role === 'specifier') {
      throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'organisationId: A specifier must belong to an organisation' })
    }
    const created = await User.create({
      email: input.email,
      name: input.name,
      passwordHash: null,
      role: input.role,
      organisationId,
      phone: null,
      emailVerifiedAt: null,
      deactivatedAt: null,
      lastSignInAt: null,
    }, { transaction })
    const token = await issueToken(created.id, 'invitation', transaction)
    const mail = accountMails.invitation(created.name, roleLabels[created.role], `${useRuntimeConfig().siteUrl}/account/set-password?token=${token}`)
    await queueMail({ kind: 'account', to: created.email, ...mail }, transaction)
    await recordAudit(event, { actorUserId: admin.id, action: 'user.invited', subjectType: 'user', subjectId: created.id, detail: { role: created.role } }, transaction)
    return created
  })
  setResponseStatus(event, 201)
  return { user: publicUser(user) }
})
