import { z } from 'zod'
import { Op } from 'sequelize'
import { User } from '../../../models'

const querySchema = z.object({
  q: z.string().trim().max(100).optional(),
  role: z.enum(['specifier', 'officer', 'manager', 'admin']).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
})

export default defineEventHandler(async (event) => {
  await requireAdmin(event)
  const { q, role, page } = await getValidatedQuery(event, parseWith(querySchema))
  useDb()
  const where = {
    ...(role ? { role } : {}),
    ...(q ? { [Op.or]: [{ name: { [Op.like]: `%${q}%` } }, { email: { [Op.like]: `%${q}%` } }] } : {}),
  }
  const pageSize = 50
  const { rows, count } = await User.findAndCountAll({ where, order: [['name', 'ASC']], limit: pageSize, offset: (page - 1) * pageSize })
  return { users: rows.map(publicUser), total: count, page, pageSize }
})
