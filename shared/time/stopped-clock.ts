import { workingMsBetween } from './working-time'
import type { Pause, WorkingCalendar } from './working-time'

/**
 * The desk's pause rule and the working times at which its two clocks stopped. Shared by the desk (which
 * stores the times whenever an enquiry changes), the migration that fills them in for older rows, and the
 * turnaround figures — one rule, so the manager's figures are the desk's own.
 */

/** A status change as the event log records it. */
export interface StatusEvent {
  kind: string
  fromValue: string | null
  toValue: string | null
  createdAt: Date
}

/** Spans spent waiting on the requester, from the enquiry's status events (the last one may still be open). */
export function pausesFromEvents(events: readonly StatusEvent[]): Pause[] {
  const pauses: Pause[] = []
  for (const e of [...events].sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())) {
    if (e.kind !== 'status') continue
    if (e.toValue === 'waiting_on_requester') pauses.push({ from: e.createdAt, to: null })
    else if (e.fromValue === 'waiting_on_requester' && pauses.length && pauses.at(-1)!.to === null) pauses.at(-1)!.to = e.createdAt
  }
  return pauses
}

export interface StoppedClockTimes {
  /** Working ms from receipt to the first reply, waits on the requester left out; null before a reply. */
  firstResponseWorkingMs: number | null
  /** Working ms from receipt to the answer, waits left out; null while unanswered. */
  answerWorkingMs: number | null
}

/**
 * Working time from receipt to the first reply and to the answer. Only pauses before each instant count,
 * so the figures never change once the clock has stopped — which is what lets them be stored.
 */
export function stoppedClockTimes(
  e: { receivedAt: Date, firstResponseAt: Date | null, answeredAt: Date | null },
  pauses: readonly Pause[],
  calendar: WorkingCalendar,
): StoppedClockTimes {
  return {
    firstResponseWorkingMs: e.firstResponseAt ? workingMsBetween(e.receivedAt, e.firstResponseAt, calendar, pauses) : null,
    answerWorkingMs: e.answeredAt ? workingMsBetween(e.receivedAt, e.answeredAt, calendar, pauses) : null,
  }
}
