import { Op } from 'sequelize'
import { addWorkingTime, workingDayMs } from '../../shared/time/working-time'
import { Enquiry, EnquiryEvent, EnquiryMessage } from '../models'

/**
 * The waiting-on-you reminder: an enquiry that has waited on its requester for the configured number of working
 * days (NUXT_REMINDER_WORKING_DAYS, 5 by default) gets one reminder per wait. The mail is queued in the same
 * transaction that marks the enquiry reminded, under the row lock, so two servers sweeping at once send it once.
 */

const longDate = new Intl.DateTimeFormat('en-IE', { dateStyle: 'full', timeStyle: 'short', timeZone: 'Europe/Dublin' })

/** Working days of waiting before the reminder; a positive number, fractions allowed. */
export function reminderWorkingDays(): number {
  const days = Number(useRuntimeConfig().reminderWorkingDays)
  return Number.isFinite(days) && days > 0 ? days : 5
}

/** Sends the reminders that are due at `now`; returns how many were queued. */
export async function sendDueReminders(now = new Date(), limit = 100): Promise<number> {
  const db = useDb()
  const calendar = deskCalendar()
  const waitMs = reminderWorkingDays() * workingDayMs(calendar)
  // Working time never runs faster than the wall clock, so this bound only drops waits that cannot be due yet.
  const candidates = await Enquiry.findAll({
    where: { status: 'waiting_on_requester', remindedAt: null, mergedIntoId: null, waitingSince: { [Op.lte]: new Date(now.getTime() - waitMs) } },
    attributes: ['id', 'waitingSince'],
    order: [['waitingSince', 'ASC']],
    limit,
  })
  let queued = 0
  for (const candidate of candidates) {
    if (addWorkingTime(candidate.waitingSince!, waitMs, calendar) > now) continue
    const sent = await db.transaction(async (transaction) => {
      const enquiry = await Enquiry.findByPk(candidate.id, { transaction, lock: transaction.LOCK.UPDATE })
      if (!enquiry || enquiry.status !== 'waiting_on_requester' || enquiry.remindedAt || !enquiry.waitingSince) return false
      const lastReply = await EnquiryMessage.findOne({ where: { enquiryId: enquiry.id, kind: 'reply' }, order: [['createdAt', 'DESC'], ['id', 'DESC']], transaction })
      const mail = reminderMail({
        ref: enquiry.ref, subject: enquiry.subject, name: enquiry.requesterName,
        waitingSince: longDate.format(enquiry.waitingSince),
        question: lastReply ? excerpt(lastReply.body) : null,
        url: requesterUrl(enquiry),
      })
      await queueEnquiryMail(enquiry, 'reminder', mail, transaction)
      await EnquiryEvent.create({ enquiryId: enquiry.id, actorUserId: null, kind: 'reminder', fromValue: enquiry.waitingSince.toISOString(), toValue: null, createdAt: now }, { transaction })
      enquiry.remindedAt = now
      await enquiry.save({ transaction })
      return true
    })
    if (sent) queued++
  }
  return queued
}

/** The start of the officer's last reply, on one line, for the reminder to recall what was asked. */
function excerpt(markdown: string, max = 300): string {
  const flat = markdown.replace(/[#>*_`]/g, '').replace(/\s+/g, ' ').trim()
  return flat.length > max ? `${flat.slice(0, max - 1).trimEnd()}…` : flat
}
