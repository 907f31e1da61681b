/**
 * Working-time arithmetic for the enquiry desk's service targets and the manager's turnaround figures.
 *
 * Everything here is pure: instants in, instants or milliseconds out. Wall-clock rules (opening hours,
 * working days, public holidays) are read in the department's time zone through `Intl.DateTimeFormat`, so a
 * DST change moves the UTC instant of "09:00" without changing the working hours counted.
 *
 * Cost: one step per local calendar day spanned (never per minute). Each calendar object keeps a cache of its
 * day windows, so a page of enquiries or a report over thousands of rows reuses the same few hundred days.
 * Treat a calendar object as immutable — build a new one when the hours or holidays change.
 */
import Holidays from 'date-holidays'
import { CalcInputError } from '../calc/errors'

const MINUTE_MS = 60_000
const HOUR_MS = 60 * MINUTE_MS
const DAY_MS = 24 * HOUR_MS

/** Either a predicate on a local date `YYYY-MM-DD`, or the set of such dates. */
export type HolidayRule = ((localDate: string) => boolean) | ReadonlySet<string>

/** When the department works, in its own time zone. */
export interface WorkingCalendar {
  /** IANA zone name of the department, e.g. `Europe/Dublin`. */
  timeZone: string
  /** Local opening time, `HH:MM` (24-hour clock). */
  dayStart: string
  /** Local closing time, `HH:MM`, later than `dayStart` on the same day (`24:00` allowed). */
  dayEnd: string
  /** ISO weekdays worked: 1 = Monday … 7 = Sunday. */
  workDays: readonly number[]
  /** Local dates on which the department is closed although they fall on a work day. */
  holidays: HolidayRule
}

/**
 * A span during which the clock does not run (the enquiry waits on the requester).
 * `to: null` means the pause is still going on.
 */
export interface Pause {
  from: Date
  to: Date | null
}

// ---------------------------------------------------------------------------------------------------------
// Irish public holidays
// ---------------------------------------------------------------------------------------------------------

/** An Irish public holiday as date-holidays names it. */
export interface NamedHoliday {
  /** Local date, `YYYY-MM-DD`. */
  date: string
  name: string
}

let irishHolidayData: Holidays | undefined
const irishYearCache = new Map<number, readonly NamedHoliday[]>()
const irishDateCache = new Map<number, ReadonlySet<string>>()

/**
 * The public holidays of Ireland in `year`, as listed in the Organisation of Working Time Act 1997, Sch. 2
 * (as amended for St Brigid's Day from 2023), taken from the `date-holidays` data for `IE`.
 *
 * Only entries of type `public` are kept. date-holidays marks Good Friday and the weekday after a public
 * holiday that falls on a weekend (e.g. 28 Dec 2026 after St Stephen's Day on a Saturday) as type `bank`:
 * neither is a public holiday under the Act, which gives no substitute Monday — an employee's entitlement
 * for a public holiday on a non-working day is a day off within a month, an extra day of leave or a day's
 * pay (s. 21). A department that closes on such days adds them to its calendar's `holidays`.
 */
export function irishPublicHolidays(year: number): readonly NamedHoliday[] {
  if (!Number.isInteger(year) || year < 1900 || year > 9999) {
    throw new CalcInputError('year', `year must be a whole year between 1900 and 9999 (got ${year})`)
  }
  let list = irishYearCache.get(year)
  if (!list) {
    irishHolidayData ??= new Holidays('IE')
    list = Object.freeze(
      irishHolidayData
        .getHolidays(year)
        .filter(h => h.type === 'public')
        .map(h => Object.freeze({ date: h.date.slice(0, 10), name: h.name })),
    )
    irishYearCache.set(year, list)
    irishDateCache.set(year, new Set(list.map(h => h.date)))
  }
  return list
}

/** True when the local date `YYYY-MM-DD` is an Irish public holiday (see {@link irishPublicHolidays}). */
export function isIrishPublicHoliday(localDate: string): boolean {
  const year = Number(localDate.slice(0, 4))
  if (!irishDateCache.has(year)) irishPublicHolidays(year)
  return irishDateCache.get(year)!.has(localDate)
}

/** One rule that closes a date when any of `rules` does (e.g. public holidays plus a Christmas Eve close). */
export function anyHoliday(...rules: HolidayRule[]): (localDate: string) => boolean {
  const tests = rules.map(r => (typeof r === 'function' ? r : (d: string) => r.has(d)))
  return localDate => tests.some(t => t(localDate))
}

/**
 * The department's default calendar: Monday to Friday, 09:00–17:30 in Europe/Dublin, closed on Irish public
 * holidays. `overrides` replaces single fields (e.g. another `timeZone`); the result is frozen.
 */
export function defaultCalendar(overrides: Partial<WorkingCalendar> = {}): WorkingCalendar {
  const calendar: WorkingCalendar = {
    timeZone: 'Europe/Dublin',
    dayStart: '09:00',
    dayEnd: '17:30',
    workDays: Object.freeze([1, 2, 3, 4, 5]),
    holidays: isIrishPublicHoliday,
    ...overrides,
  }
  compile(calendar) // fail now, not on first use, if an override is wrong
  return Object.freeze(calendar)
}

// ---------------------------------------------------------------------------------------------------------
// Time zone helpers (Intl only)
// ---------------------------------------------------------------------------------------------------------

const formatters = new Map<string, Intl.DateTimeFormat>()

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone)
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: 'numeric',
        day: 'numeric',
        hour: 'numeric',
        minute: 'numeric',
        second: 'numeric',
      })
    }
    catch {
      throw new CalcInputError('timeZone', `timeZone "${timeZone}" is not a time zone this system knows (use an IANA name such as Europe/Dublin)`)
    }
    formatters.set(timeZone, f)
  }
  return f
}

/** The wall clock in `timeZone` at `instant`, written as if it were UTC (ms since epoch, whole seconds). */
function wallClockMs(instant: number, timeZone: string): number {
  const p: Record<string, number> = {}
  for (const part of formatterFor(timeZone).formatToParts(instant)) {
    if (part.type !== 'literal') p[part.type] = Number(part.value)
  }
  return Date.UTC(p.year!, p.month! - 1, p.day!, p.hour!, p.minute!, p.second!)
}

/** Offset of `timeZone` from UTC at `instant`, in ms (Dublin: 0 in winter, +1 h in summer). */
function offsetMs(instant: number, timeZone: string): number {
  const whole = Math.floor(instant / 1000) * 1000
  return wallClockMs(whole, timeZone) - whole
}

/**
 * The instant at which the wall clock in `timeZone` shows `wall` (a wall time written as UTC ms).
 * Ambiguous wall times (clocks going back) give the earlier instant; wall times skipped when clocks go
 * forward give the instant the same distance after the jump — the "compatible" rule of ECMAScript Temporal.
 */
function zonedWallTimeToInstant(wall: number, timeZone: string): number {
  const before = wall - offsetMs(wall - DAY_MS, timeZone)
  const after = wall - offsetMs(wall + DAY_MS, timeZone)
  const fits = (t: number) => t + offsetMs(t, timeZone) === wall
  const a = fits(before)
  const b = fits(after)
  if (a && b) return Math.min(before, after)
  if (a) return before
  if (b) return after
  return before
}

/** Days since 1970-01-01 of the local date in `timeZone` at `instant`. */
function localDayNumber(instant: number, timeZone: string): number {
  return Math.floor(wallClockMs(instant, timeZone) / DAY_MS)
}

function dayNumberToDate(day: number): string {
  return new Date(day * DAY_MS).toISOString().slice(0, 10)
}

/** The local date `YYYY-MM-DD` in `timeZone` at `instant` (for grouping report rows by local day or week). */
export function localDateOf(instant: Date, timeZone: string): string {
  return dayNumberToDate(localDayNumber(requireInstant('instant', instant), timeZone))
}

// ---------------------------------------------------------------------------------------------------------
// Calendar compilation and day windows
// ---------------------------------------------------------------------------------------------------------

interface Window {
  open: number
  close: number
}

interface CompiledCalendar {
  timeZone: string
  startMinute: number
  endMinute: number
  isWorkDay: readonly boolean[]
  isHoliday: (localDate: string) => boolean
  windows: Map<number, Window | null>
}

const compiled = new WeakMap<WorkingCalendar, CompiledCalendar>()

function parseClock(field: string, value: unknown, allowMidnightEnd: boolean): number {
  const m = typeof value === 'string' ? /^(\d{2}):(\d{2})$/.exec(value) : null
  const minutes = m ? Number(m[1]) * 60 + Number(m[2]) : Number.NaN
  const ok = m !== null && Number(m[2]) < 60 && (minutes < 1440 || (allowMidnightEnd && minutes === 1440))
  if (!ok) throw new CalcInputError(field, `${field} must be a time of day written HH:MM, e.g. 09:00 (got ${JSON.stringify(value)})`)
  return minutes
}

function compile(calendar: WorkingCalendar): CompiledCalendar {
  let c = compiled.get(calendar)
  if (c) return c
  if (!calendar || typeof calendar !== 'object') throw new CalcInputError('calendar', 'calendar is required')
  formatterFor(calendar.timeZone)
  const startMinute = parseClock('dayStart', calendar.dayStart, false)
  const endMinute = parseClock('dayEnd', calendar.dayEnd, true)
  if (endMinute <= startMinute) {
    throw new CalcInputError('dayEnd', `dayEnd (${calendar.dayEnd}) must be later than dayStart (${calendar.dayStart}) on the same day`)
  }
  const days = calendar.workDays
  if (!Array.isArray(days) || days.length === 0 || days.some(d => !Number.isInteger(d) || d < 1 || d > 7)) {
    throw new CalcInputError('workDays', 'workDays must list at least one ISO weekday from 1 (Monday) to 7 (Sunday)')
  }
  const isWorkDay = Array.from({ length: 8 }, (_, d) => days.includes(d))
  const rule = calendar.holidays
  let isHoliday: (localDate: string) => boolean
  if (typeof rule === 'function') isHoliday = rule
  else if (rule instanceof Set) isHoliday = d => rule.has(d)
  else throw new CalcInputError('holidays', 'holidays must be a function of a local date or a Set of YYYY-MM-DD dates')
  c = { timeZone: calendar.timeZone, startMinute, endMinute, isWorkDay, isHoliday, windows: new Map() }
  compiled.set(calendar, c)
  return c
}

/** The working window of local day `day` (days since 1970-01-01), or null when the day is not worked. */
function windowOf(c: CompiledCalendar, day: number): Window | null {
  let w = c.windows.get(day)
  if (w !== undefined) return w
  // 1970-01-01 was a Thursday (ISO 4).
  const isoWeekday = ((((day + 3) % 7) + 7) % 7) + 1
  if (!c.isWorkDay[isoWeekday] || c.isHoliday(dayNumberToDate(day))) {
    w = null
  }
  else {
    const midnight = day * DAY_MS
    w = {
      open: zonedWallTimeToInstant(midnight + c.startMinute * MINUTE_MS, c.timeZone),
      close: zonedWallTimeToInstant(midnight + c.endMinute * MINUTE_MS, c.timeZone),
    }
  }
  c.windows.set(day, w)
  return w
}

/**
 * The opening and closing instants of a local date `YYYY-MM-DD`, or null when the department is closed that
 * day (weekend or holiday). Useful for showing opening hours and for tests.
 */
export function workingWindow(localDate: string, calendar: WorkingCalendar): { open: Date, close: Date } | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate)
  const ms = m ? Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) : Number.NaN
  if (!m || Number.isNaN(ms) || dayNumberToDate(ms / DAY_MS) !== localDate) {
    throw new CalcInputError('localDate', `localDate must be a calendar date written YYYY-MM-DD (got ${JSON.stringify(localDate)})`)
  }
  const w = windowOf(compile(calendar), ms / DAY_MS)
  return w ? { open: new Date(w.open), close: new Date(w.close) } : null
}

/**
 * Length of one working day of `calendar` in ms (dayEnd − dayStart; 8.5 h for the default calendar).
 * This is the unit "working day" in service targets and in {@link formatWorkingDuration}.
 */
export function workingDayMs(calendar: WorkingCalendar): number {
  const c = compile(calendar)
  return (c.endMinute - c.startMinute) * MINUTE_MS
}

/** One working day of the default calendar (09:00–17:30): 8.5 h in ms. */
export const WORKING_DAY_MS = 8.5 * HOUR_MS

/** One working hour in ms. */
export const WORKING_HOUR_MS = HOUR_MS

// ---------------------------------------------------------------------------------------------------------
// Arithmetic
// ---------------------------------------------------------------------------------------------------------

function requireInstant(field: string, value: unknown): number {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) {
    throw new CalcInputError(field, `${field} must be a valid date and time`)
  }
  return value.getTime()
}

interface Span {
  from: number
  to: number
}

/**
 * Pauses as sorted, non-overlapping spans clipped to [lo, hi). An open pause runs to `openEnd`;
 * `openEnd` undefined means open pauses are not allowed here.
 */
function normalisePauses(pauses: readonly Pause[] | undefined, lo: number, hi: number, openEnd?: number): Span[] {
  if (!pauses || pauses.length === 0) return []
  if (!Array.isArray(pauses)) throw new CalcInputError('pauses', 'pauses must be a list of { from, to } spans')
  const spans: Span[] = []
  pauses.forEach((p, i) => {
    const from = requireInstant(`pauses[${i}].from`, p?.from)
    let to: number
    if (p.to === null || p.to === undefined) {
      if (openEnd === undefined) {
        throw new CalcInputError(`pauses[${i}].to`, `pauses[${i}] has no end; a due time cannot be worked out while the clock is stopped for good — close the pause at a known instant (e.g. now)`)
      }
      // An open pause that begins after the span's end simply does not reach into it.
      to = Math.max(openEnd, from)
    }
    else {
      to = requireInstant(`pauses[${i}].to`, p.to)
    }
    if (to < from) throw new CalcInputError(`pauses[${i}].to`, `pauses[${i}] ends before it starts`)
    const a = Math.max(from, lo)
    const b = Math.min(to, hi)
    if (b > a) spans.push({ from: a, to: b })
  })
  spans.sort((x, y) => x.from - y.from)
  const merged: Span[] = []
  for (const s of spans) {
    const last = merged[merged.length - 1]
    if (last && s.from <= last.to) last.to = Math.max(last.to, s.to)
    else merged.push({ ...s })
  }
  return merged
}

/**
 * Working time in [start, end) in ms: the parts of that span inside the calendar's opening hours on working
 * days that are not holidays, less the pauses. Pauses may overlap one another (counted once); a pause with
 * `to: null` runs to `end`. An empty or reversed span has no working time (0).
 */
export function workingMsBetween(start: Date, end: Date, calendar: WorkingCalendar, pauses: readonly Pause[] = []): number {
  const s = requireInstant('start', start)
  const e = requireInstant('end', end)
  const c = compile(calendar)
  if (e <= s) return 0
  const paused = normalisePauses(pauses, s, e, e)
  let total = 0
  let pi = 0
  const lastDay = localDayNumber(e, c.timeZone)
  for (let day = localDayNumber(s, c.timeZone); day <= lastDay; day++) {
    const w = windowOf(c, day)
    if (!w) continue
    const a = Math.max(w.open, s)
    const b = Math.min(w.close, e)
    if (b <= a) continue
    total += b - a
    while (pi < paused.length && paused[pi]!.to <= a) pi++
    for (let j = pi; j < paused.length && paused[j]!.from < b; j++) {
      total -= Math.min(b, paused[j]!.to) - Math.max(a, paused[j]!.from)
    }
  }
  return total
}

/** Days without any opening after which {@link addWorkingTime} gives up: ten years. */
const MAX_CLOSED_DAYS = 3660

/**
 * The earliest instant at which `workingMs` of working time has passed since `start` — the due time.
 * Starting outside hours starts the count at the next opening; a target that runs out exactly at closing time
 * is due at closing time, not at the next opening. Pauses push the due time later by the working time they
 * cover; every pause must have an end (pass `now` for one still running). `workingMs` is rounded to whole ms;
 * 0 gives `start` itself.
 */
export function addWorkingTime(start: Date, workingMs: number, calendar: WorkingCalendar, pauses: readonly Pause[] = []): Date {
  const s = requireInstant('start', start)
  if (typeof workingMs !== 'number' || !Number.isFinite(workingMs) || workingMs < 0) {
    throw new CalcInputError('workingMs', `workingMs must be a number of milliseconds, zero or more (got ${workingMs})`)
  }
  const c = compile(calendar)
  let remaining = Math.round(workingMs)
  if (remaining === 0) return new Date(s)
  const paused = normalisePauses(pauses, s, Number.POSITIVE_INFINITY)
  let pi = 0
  let closedDays = 0
  for (let day = localDayNumber(s, c.timeZone); ; day++) {
    const w = windowOf(c, day)
    if (!w) {
      if (++closedDays > MAX_CLOSED_DAYS) {
        throw new CalcInputError('calendar', 'the calendar has no working hours in the ten years after the start; check its work days and holidays')
      }
      continue
    }
    closedDays = 0
    const a = Math.max(w.open, s)
    const b = w.close
    if (b <= a) continue
    while (pi < paused.length && paused[pi]!.to <= a) pi++
    let cursor = a
    for (let j = pi; j < paused.length && paused[j]!.from < b && cursor < b; j++) {
      const p = paused[j]!
      if (p.from > cursor) {
        const free = p.from - cursor
        if (remaining <= free) return new Date(cursor + remaining)
        remaining -= free
      }
      cursor = Math.max(cursor, p.to)
    }
    if (cursor < b) {
      const free = b - cursor
      if (remaining <= free) return new Date(cursor + remaining)
      remaining -= free
    }
  }
}

// ---------------------------------------------------------------------------------------------------------
// Service targets
// ---------------------------------------------------------------------------------------------------------

/** Enquiry priorities that carry their own targets. `urgent` means a site is stopped. */
export type ServicePriority = 'normal' | 'urgent'

/** Working time allowed for one priority, in ms. */
export interface ServiceTarget {
  /** From receipt to the first reply to the requester. */
  firstResponseMs: number
  /** From receipt to the answer. */
  answerMs: number
}

/** Targets per priority. Managers can edit them; this shape is what gets stored. */
export type ServiceTargetPolicy = Readonly<Record<ServicePriority, Readonly<ServiceTarget>>>

/**
 * The department's starting policy: first response within 2 working days and the answer within 5;
 * an urgent enquiry gets both within 4 working hours. Days are default-calendar days of 8.5 h.
 */
export const defaultServiceTargets: ServiceTargetPolicy = Object.freeze({
  normal: Object.freeze({ firstResponseMs: 2 * WORKING_DAY_MS, answerMs: 5 * WORKING_DAY_MS }),
  urgent: Object.freeze({ firstResponseMs: 4 * WORKING_HOUR_MS, answerMs: 4 * WORKING_HOUR_MS }),
})

/** Input of {@link serviceClock}. */
export interface ServiceClockInput {
  /** When the enquiry arrived; the clock starts here (or at the next opening). */
  receivedAt: Date
  /** Working time allowed, in ms (e.g. `defaultServiceTargets.normal.answerMs`). */
  targetWorkingMs: number
  /** The present instant. */
  now: Date
  /** Spans waiting on the requester; one still running has `to: null`. */
  pauses?: readonly Pause[]
  /** When the clock stopped for good (first reply sent, or answer given); omitted or null while running. */
  stoppedAt?: Date | null
  calendar: WorkingCalendar
}

/** State of one service-target clock. */
export interface ServiceClock {
  /** When the target runs out, with the pauses so far taken into account (moves on while paused). */
  dueAt: Date
  /** Working time counted so far (to `stoppedAt` when stopped), pauses excluded. */
  elapsedWorkingMs: number
  /** Target minus elapsed; negative when overdue. */
  remainingWorkingMs: number
  /** True once the clock's end (now, or `stoppedAt`) is later than `dueAt`. */
  overdue: boolean
  /** True when a pause is running now and the clock has not stopped. */
  paused: boolean
  /** True when `stoppedAt` was given. */
  stopped: boolean
}

/**
 * The service-target clock of one enquiry. It runs in working time from `receivedAt` to `stoppedAt` (or
 * `now`), and stands still during pauses — a pause still running counts up to that end, so `dueAt` moves
 * later for as long as the enquiry waits on the requester. Pauses after the clock stopped do not count.
 * `overdue` compares instants, so an enquiry due at 17:30 is overdue at 18:00 although no working time has
 * passed since; `remainingWorkingMs` is then 0.
 */
export function serviceClock(input: ServiceClockInput): ServiceClock {
  const { receivedAt, targetWorkingMs, now, pauses = [], stoppedAt = null, calendar } = input
  const received = requireInstant('receivedAt', receivedAt)
  const nowMs = requireInstant('now', now)
  const stopped = stoppedAt !== null && stoppedAt !== undefined
  const end = stopped ? requireInstant('stoppedAt', stoppedAt) : nowMs
  if (typeof targetWorkingMs !== 'number' || !Number.isFinite(targetWorkingMs) || targetWorkingMs <= 0) {
    throw new CalcInputError('targetWorkingMs', `targetWorkingMs must be a number of milliseconds greater than zero (got ${targetWorkingMs})`)
  }
  const target = Math.round(targetWorkingMs)
  const closed: Pause[] = normalisePauses(pauses, received, Math.max(received, end), end)
    .map(p => ({ from: new Date(p.from), to: new Date(p.to) }))
  const elapsedWorkingMs = workingMsBetween(receivedAt, new Date(end), calendar, closed)
  const dueAt = addWorkingTime(receivedAt, target, calendar, closed)
  const paused = !stopped && pauses.some(p => p.from.getTime() <= nowMs && (p.to === null || p.to.getTime() > nowMs))
  return {
    dueAt,
    elapsedWorkingMs,
    remainingWorkingMs: target - elapsedWorkingMs,
    overdue: end > dueAt.getTime(),
    paused,
    stopped,
  }
}

// ---------------------------------------------------------------------------------------------------------
// Display
// ---------------------------------------------------------------------------------------------------------

export { formatWorkingDuration } from './format-duration'
