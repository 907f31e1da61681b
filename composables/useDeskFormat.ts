import { formatWorkingDuration } from '~~/shared/time/format-duration'

export { formatCount } from '~~/shared/format/count'

/** The desk shows every time in the department's own zone, whatever the reader's device says. */
const deskTimeZone = 'Europe/Dublin'
// Made on first use: building a formatter for a named zone loads the zone's rules, which costs a phone tens
// of milliseconds, and most pages that load this file never show a time.
let dateTime: Intl.DateTimeFormat | undefined
let dateOnly: Intl.DateTimeFormat | undefined

// The first use of Intl in a page holds the main thread in one block while the ICU library starts and then
// the zone's rules load: in Chromium at Lighthouse's 4× CPU slowdown, 120–180 ms for the first number format
// and up to 390 ms for the first zoned date format. On the desk that was most of the blocking time at load. So the labels the server makes while rendering a page travel in the page's payload, and
// hydrating the page reads them back instead of formatting again. Only a time the server never showed (new
// rows after a filter change) is formatted in the browser. Labels are written on the server only: writing
// reactive state while rendering in the browser would render the component a second time.
function remembered(kind: string, value: string | Date, make: (d: Date) => string): string {
  const key = `${kind}|${typeof value === 'string' ? value : value.toISOString()}`
  if (!tryUseNuxtApp()) return make(new Date(value))
  const labels = useState<Record<string, string>>('time-labels', () => ({}))
  const known = labels.value[key]
  if (known !== undefined) return known
  const made = make(new Date(value))
  if (import.meta.server) labels.value[key] = made
  return made
}

export function formatDateTime(value: string | Date | null | undefined): string {
  if (!value) return '—'
  return remembered('date-time', value, (d) => {
    dateTime ??= new Intl.DateTimeFormat('en-IE', { dateStyle: 'medium', timeStyle: 'short', timeZone: deskTimeZone })
    return dateTime.format(d)
  })
}

export function formatDate(value: string | Date | null | undefined): string {
  if (!value) return '—'
  return remembered('date', value, (d) => {
    dateOnly ??= new Intl.DateTimeFormat('en-IE', { dateStyle: 'medium', timeZone: deskTimeZone })
    return dateOnly.format(d)
  })
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
