import { idParamSchema, mergeOrganisationSchema } from '../../../../../shared/schemas/auth'
import { Enquiry, Organisation, Project, User } from '../../../../models'

/** Folds a duplicate organisation into another: its people, projects and enquiries move; the record stays as a pointer. */
export default defineEventHandler(async (event) => {
  const admin = await requireAdmin(event)
  const { id } = await getValidatedRouterParams(event, parseWith(idParamSchema))
  const { intoId } = await readValidatedBody(event, parseWith(mergeOrganisationSchema))
  if (intoId === id) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'intoId: An organisation cannot be merged into itself' })
  const db = useDb()
  const result = await db.transaction(async (transaction) => {
    const [source, target] = await Promise.all([
      Organisation.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }),
      Organisation.findByPk(intoId, { transaction, lock: transaction.LOCK.UPDATE }),
    ])
    if (!source) notFound('organisation')
    if (!target) throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'intoId: No such organisation' })
    if (source.mergedIntoId || target.mergedIntoId) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'One of these organisations has already been merged away.' })
    }
    const where = { organisationId: id }
    const [[people], [projects], [enquiries]] = await Promise.all([
      User.update({ organisationId: intoId }, { where, transaction }),
      Project.update({ organisationId: intoId }, { where, transaction }),
      Enquiry.update({ organisationId: intoId }, { where, transaction }),
    ])
    source.mergedIntoId = intoId
    await source.save({ transaction })
    await recordAudit(event, { actorUserId: admin.id, action: 'organisation.merged', subjectType: 'organisation', subjectId: id, detail: { intoId, people, projects, enquiries } }, transaction)
    return { people, projects, enquiries }
  })
  return { merged: { from: id, into: intoId, moved: result } }
})
