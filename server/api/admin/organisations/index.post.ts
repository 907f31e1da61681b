import { createOrganisationSchema } from '../../../../shared/schemas/auth'
import { Organisation } from '../../../models'

export default defineEventHandler(async (event) => {
  const admin = await requireAdmin(event)
  const input = await readValidatedBody(event, parseWith(createOrganisationSchema))
  const db = useDb()
  const organisation = await db.transaction(async (transaction) => {
    const created = await Organisation.create({ name: input.name, kind: input.kind, mergedIntoId: null }, { transaction })
    await recordAudit(event, { actorUserId: admin.id, action: 'organisation.created', subjectType: 'organisation', subjectId: created.id }, transaction)
    return created
  })
  setResponseStatus(event, 201)
  return { organisation: publicOrganisation(organisation) }
})
