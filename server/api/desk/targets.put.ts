import { Op } from 'sequelize'
import { serviceTargetsSchema } from '../../../shared/schemas/enquiry'
import { Enquiry, ServiceTarget } from '../../models'

/**
 * Managers set the service targets (working minutes). Open enquiries get their due times recomputed in the
 * same transaction, so the queue's "overdue" agrees with the new policy at once.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireManager(event)
  const { targets } = await readValidatedBody(event, parseWith(serviceTargetsSchema))
  const db = useDb()
  const updated = await db.transaction(async (transaction) => {
    for (const t of targets) {
      if (t.firstResponseMinutes > t.answerMinutes) {
        throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: `${t.priority}: the first response cannot be due after the answer.` })
      }
      await ServiceTarget.upsert({ priority: t.priority, firstResponseMinutes: t.firstResponseMinutes, answerMinutes: t.answerMinutes, updatedBy: caller.id }, { transaction })
    }
    await recordAudit(event, { actorUserId: caller.id, action: 'service-targets.changed', subjectType: 'service_targets', detail: { targets } }, transaction)
    const open = await Enquiry.findAll({ where: { status: { [Op.notIn]: ['answered', 'closed'] }, priority: targets.map(t => t.priority), mergedIntoId: null }, transaction })
    for (const enquiry of open) {
      await refreshDueTimes(enquiry, transaction)
      await enquiry.save({ transaction })
    }
    return open.length
  })
  return { targets, recomputed: updated }
})
