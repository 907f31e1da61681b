import { enquiryPatchSchema } from '../../../shared/schemas/enquiry'
import { enquiryStatusLabels, statusTransitions } from '../../../shared/types/enquiry'
import type { EnquiryStatus } from '../../../shared/types/enquiry'
import { EnquiryEvent, User } from '../../models'

/**
 * Status, priority and assignment of an enquiry; each change is an event (who, when, from, to). Closing an
 * enquiry tells the requester, threaded onto the earlier mail.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const input = await readValidatedBody(event, parseWith(enquiryPatchSchema))
  const db = useDb()
  const enquiry = await db.transaction(async (transaction) => {
    const enquiry = await findEnquiryFor(event, caller, { transaction, lock: true })
    if (enquiry.mergedIntoId) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This enquiry was merged into another; work on that one instead.' })
    const now = new Date()
    const record = (kind: 'status' | 'assignee' | 'priority', from: string | null, to: string | null) =>
      EnquiryEvent.create({ enquiryId: enquiry.id, actorUserId: caller.id, kind, fromValue: from, toValue: to, createdAt: now }, { transaction })

    if (input.assigneeId !== undefined && input.assigneeId !== enquiry.assigneeId) {
      if (input.assigneeId !== null) {
        const assignee = await User.findByPk(input.assigneeId, { transaction })
        if (!assignee || assignee.deactivatedAt || !['officer', 'manager', 'admin'].includes(assignee.role)) {
          throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'assigneeId: Enquiries can be assigned only to active department staff.' })
        }
      }
      await record('assignee', enquiry.assigneeId ? String(enquiry.assigneeId) : null, input.assigneeId ? String(input.assigneeId) : null)
      enquiry.assigneeId = input.assigneeId
    }
    if (input.priority && input.priority !== enquiry.priority) {
      await record('priority', enquiry.priority, input.priority)
      enquiry.priority = input.priority
    }
    if (input.status && input.status !== enquiry.status) {
      const from = enquiry.status as EnquiryStatus
      if (!statusTransitions[from].includes(input.status)) {
        throw createError({
          statusCode: 409,
          statusMessage: 'Status change not allowed',
          message: `An enquiry that is "${enquiryStatusLabels[from]}" cannot become "${enquiryStatusLabels[input.status]}". Allowed next: ${statusTransitions[from].map(s => enquiryStatusLabels[s]).join(', ')}.`,
        })
      }
      await record('status', from, input.status)
      enquiry.status = input.status
      if (input.status === 'waiting_on_requester' || input.status === 'answered') enquiry.firstResponseAt ??= now
      if (input.status === 'answered') enquiry.answeredAt = now
      if (input.status === 'waiting_on_requester') enquiry.remindedAt = null
      if (input.status === 'closed') {
        enquiry.closedAt = now
        const mail = closedMail({ ref: enquiry.ref, subject: enquiry.subject, name: enquiry.requesterName, officer: caller.name, url: requesterUrl(enquiry) })
        await queueEnquiryMail(enquiry, 'closed', mail, transaction)
      }
      if (input.status === 'reopened') {
        enquiry.answeredAt = null
        enquiry.closedAt = null
      }
    }
    enquiry.lastActivityAt = now
    await refreshDueTimes(enquiry, transaction)
    await enquiry.save({ transaction })
    return enquiry
  })
  return { ref: enquiry.ref, status: enquiry.status, priority: enquiry.priority, assigneeId: enquiry.assigneeId, clock: clockState(enquiry) }
})
