import { ServiceTarget } from '../../models'

export default defineEventHandler(async (event) => {
  await requireStaff(event)
  useDb()
  const rows = await ServiceTarget.findAll({ order: [['priority', 'ASC']] })
  return { targets: rows.map(r => ({ priority: r.priority, firstResponseMinutes: r.firstResponseMinutes, answerMinutes: r.answerMinutes, updatedAt: r.updatedAt })) }
})
