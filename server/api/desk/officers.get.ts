import { Op } from 'sequelize'
import { User } from '../../models'

/** Department staff an enquiry can be assigned to. */
export default defineEventHandler(async (event) => {
  await requireStaff(event)
  useDb()
  const staff = await User.findAll({
    where: { role: { [Op.in]: ['officer', 'manager', 'admin'] }, deactivatedAt: null },
    attributes: ['id', 'name', 'role'],
    order: [['name', 'ASC']],
  })
  return { officers: staff.map(s => ({ id: s.id, name: s.name, role: s.role })) }
})
