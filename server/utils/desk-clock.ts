import type { Transaction } from 'sequelize'
import { addWorkingTime, defaultCalendar, workingMsBetween } from '../../shared/time/working-time'
import type { Pause, ServicePriority, ServiceTargetPolicy } from '../../shared/time/working-time'
import { pausesFromEvents, stoppedClockTimes } from '../../shared/time/stopped-clock'
import { EnquiryEvent, ServiceTarget } from '../models'
import type { Enquiry } from '../models'

/**
 * The desk's service-target clock: the same working-time module the manager's figures use, fed with the
 * department's calendar, the targets managers set, and the pauses while an enquiry waits on its requester.
 */

let calendar: ReturnType<typeof defaultCalendar> | null = null
export function deskCalendar() {
  calendar ??= defaultCalendar()
  return calendar
}

export async function loadServiceTargets(transaction?: Transaction): Promise<ServiceTargetPolicy> {
  useDb()
  const rows = await ServiceTarget.findAll({ transaction })
  const policy = { normal: { firstResponseMs: 0, answerMs: 0 }, urgent: { firstResponseMs: 0, answerMs: 0 } }
  for (const row of rows) {
    policy[row.priority as ServicePriority] = { firstResponseMs: row.firstResponseMinutes * 60_000, answerMs: row.answerMinutes * 60_000 }
  }
  return policy
}

export { pausesFromEvents }

/**
 * Recomputes the stored due times, and the working times of clocks that have stopped, after any change of
 * state (every route that changes an enquiry's life calls this in its transaction). While the enquiry waits on the requester its
 * running clock has no due time (it moves on for as long as the wait lasts), so next_due_at is null.
 */
export async function refreshDueTimes(enquiry: Enquiry, transaction: Transaction): Promise<void> {
  const [targets, events] = await Promise.all([
    loadServiceTargets(transaction),
    EnquiryEvent.findAll({ where: { enquiryId: enquiry.id, kind: 'status' }, order: [['createdAt', 'ASC'], ['id', 'ASC']], transaction }),
  ])
  Object.assign(enquiry, computeDueTimes(enquiry, pausesFromEvents(events), targets))
}

/** The pure part of {@link refreshDueTimes}, also used by the demo seed. */
export function computeDueTimes(
  e: Pick<Enquiry, 'receivedAt' | 'priority' | 'status' | 'firstResponseAt' | 'answeredAt'>,
  pauses: Pause[],
  targets: ServiceTargetPolicy,
): Pick<Enquiry, 'firstResponseDueAt' | 'answerDueAt' | 'waitingSince' | 'nextDueAt' | 'firstResponseWorkingMs' | 'answerWorkingMs'> {
  const target = targets[e.priority as ServicePriority] ?? targets.normal
  const closedPauses = pauses.filter(p => p.to !== null)
  const waiting = pauses.some(p => p.to === null)
  const cal = deskCalendar()
  const firstResponseDueAt = addWorkingTime(e.receivedAt, target.firstResponseMs, cal, closedPauses)
  const answerDueAt = addWorkingTime(e.receivedAt, target.answerMs, cal, closedPauses)
  const done = ['answered', 'closed'].includes(e.status)
  return {
    firstResponseDueAt,
    answerDueAt,
    waitingSince: waiting ? pauses.at(-1)!.from : null,
    nextDueAt: done || waiting ? null : (e.firstResponseAt ? answerDueAt : firstResponseDueAt),
    ...stoppedClockTimes(e, pauses, cal),
  }
}

export type ClockState =
  | { state: 'running', clock: 'first-response' | 'answer', dueAt: string, remainingMs: number, overdue: boolean }
  | { state: 'paused', since: string | null }
  | { state: 'stopped' }

/** What the queue and the file show: time left or time overdue, in working time, from the stored due time. */
export function clockState(e: Pick<Enquiry, 'status' | 'nextDueAt' | 'firstResponseAt' | 'waitingSince'>, now = new Date()): ClockState {
  if (e.status === 'waiting_on_requester') return { state: 'paused', since: e.waitingSince?.toISOString() ?? null }
  if (!e.nextDueAt) return { state: 'stopped' }
  const cal = deskCalendar()
  const overdue = now.getTime() > e.nextDueAt.getTime()
  const remainingMs = overdue ? -workingMsBetween(e.nextDueAt, now, cal) : workingMsBetween(now, e.nextDueAt, cal)
  return { state: 'running', clock: e.firstResponseAt ? 'answer' : 'first-response', dueAt: e.nextDueAt.toISOString(), remainingMs, overdue }
}
