import { fn, col } from 'sequelize'
import { Organisation, User } from '../../../models'

export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  useDb()
  const organisations = await Organisation.findAll({ where: { mergedIntoId: null }, order: [['name', 'ASC']] })
  const counts = await User.findAll({
    attributes: ['organisationId', [fn('COUNT', col('id')), 'members']],
    group: ['organisationId'],
    raw: true,
  }) as unknown as { organisationId: number | null, members: number }[]
  const byOrg = new Map(counts.map(c => [c.organisationId, Number(c.members)]))
  return { organisations: organisations.map(o => ({ ...publicOrganisation(o), members: byOrg.get(o.id) ?? 0 })) }
})
