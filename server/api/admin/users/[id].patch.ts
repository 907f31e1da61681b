import { idParamSchema, updateUserSchema } from '../../../../shared/schemas/auth'
import { Organisation, User } from '../../../models'

/** Change a person's role or organisation, or deactivate / reactivate them. Their session follows on the next request. */
export default defineEventHandler(async (event) => {
  const admin = await requireAdmin(event)
  const { id } = await getValidatedRouterParams(event, parseWith(idParamSchema))
  const input = await readValidatedBody(event, parseWith(updateUserSchema))
  const db = useDb()
  const user = await db.transaction(async (transaction) => {
    const user = await User.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE })
    if (!user) notFound('user')
    if (user.id === admin.id && (input.active === false || (input.role && input.role !== 'admin'))) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'You cannot deactivate or demote your own account; ask another admin.' })
    }
    if (input.role && input.role !== user.role) {
      await recordAudit(event, { actorUserId: admin.id, action: 'user.role-changed', subjectType: 'user', subjectId: user.id, detail: { from: user.role, to: input.role } }, transaction)
      user.role = input.role
    }
    if (input.active !== undefined && input.active === !!user.deactivatedAt) {
      user.deactivatedAt = input.active ? null : new Date()
      await recordAudit(event, { actorUserId: admin.id, action: input.active ? 'user.reactivated' : 'user.deactivated', subjectType: 'user', subjectId: user.id }, transaction)
    }
    if (input.organisationId !== undefined && input.organisationId !== user.organisationId) {
      if (input.organisationId !== null && !(await Organisation.findByPk(input.organisationId, { transaction }))) {
        throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'organisationId: No such organisation' })
      }
      await recordAudit(event, { actorUserId: admin.id, action: 'user.organisation-changed', subjectType: 'user', subjectId: user.id, detail: { from: user.organisationId, to: input.organisationId } }, transaction)
      user.organisationId = input.organisationId
    }
    if (user.role === 'specifier' && !user.organisationId) {
      throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'A specifier must belong to an organisation' })
    }
    await user.save({ transaction })
    return user
  })
  return { user: publicUser(user) }
})
