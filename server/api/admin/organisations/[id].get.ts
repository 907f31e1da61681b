import { idParamSchema } from '../../../../shared/schemas/auth'
import { Organisation, User } from '../../../models'

export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  const { id } = await getValidatedRouterParams(event, parseWith(idParamSchema))
  useDb()
  const organisation = await Organisation.findByPk(id)
  if (!organisation) notFound('organisation')
  const members = await User.findAll({ where: { organisationId: id }, order: [['name', 'ASC']] })
  return { organisation: publicOrganisation(organisation), members: members.map(publicUser) }
})
