import { formatWorkingDuration } from '~~/shared/time/format-duration'

/** The desk shows every time in the department's own zone, whatever the reader's device says. */
const deskTimeZone = 'Europe/Dublin'
// Made on first use: building a formatter for a named zone loads the zone's rules, which costs a phone tens
// of milliseconds, and most pages that load this file never show a time.
let dateTime: Intl.DateTimeFormat | undefined
let dateOnly: Intl.DateTimeFormat | undefined

export function formatDateTime(value: string | Date | null | undefined): string {
  if (!value) return '—'
  dateTime ??= new Intl.DateTimeFormat('en-IE', { dateStyle: 'medium', timeStyle: 'short', timeZone: deskTimeZone })
  return dateTime.format(new Date(value))
}

export function formatDate(value: string | Date | null | undefined): string {
  if (!value) return '—'
  dateOnly ??= new Intl.DateTimeFormat('en-IE', { dateStyle: 'medium', timeZone: deskTimeZone })
  return dateOnly.format(new Date(value))
}

/** "2.4 MB": binary multiples, as file managers show them. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`
  const units = ['KB', 'MB', 'GB']
  let value = bytes / 1024
  let unit = 0
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024
    unit++
  }
  return `${value >= 10 ? Math.round(value) : value.toFixed(1)} ${units[unit]}`
}

export type DeskClock =
  | { state: 'running', clock: 'first-response' | 'answer', dueAt: string, remainingMs: number, overdue: boolean }
  | { state: 'paused', since: string | null }
  | { state: 'stopped' }

/** The service-target clock in words: "2 d 3 h left", "4 h 10 min overdue", "paused (waiting on requester)". */
export function clockText(clock: DeskClock | null | undefined): string {
  if (!clock) return ''
  if (clock.state === 'paused') return 'Paused (waiting on requester)'
  if (clock.state === 'stopped') return 'No target running'
  if (clock.overdue) return formatWorkingDuration(-Math.max(Math.abs(clock.remainingMs), 60_000))
  return `${formatWorkingDuration(clock.remainingMs)} left`
}

export function clockLabel(clock: DeskClock | null | undefined): string {
  if (!clock || clock.state !== 'running') return ''
  return clock.clock === 'first-response' ? 'to first response' : 'to the answer'
}

/** A file of an enquiry as the enquiry route lists it. */
export interface EnquiryAttachment {
  id: number
  messageId: number | null
  fileName: string
  fileType: string
  contentType: string
  sizeBytes: number
  internal: boolean
  createdAt: string | Date
  url: string
}
