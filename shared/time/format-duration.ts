import { CalcInputError } from '../calc/errors'

/**
 * Working durations written for people. Apart from the calendar arithmetic (working-time.ts, which carries
 * the holiday tables of date-holidays), so that the pages showing a clock do not ship those tables.
 */

const MINUTE_MS = 60_000

/** A working day of the department's default calendar, 09:00–17:30. */
const WORKING_DAY_MS = 8.5 * 60 * MINUTE_MS

/**
 * Working time for people: "1 d 3 h 15 min", where a day is `dayMs` (default 8.5 h, the department's day —
 * pass `workingDayMs(calendar)` for another calendar). Rounded to the nearest minute; zero parts are left out;
 * a negative value reads "3 h 10 min overdue". Anything under half a minute reads "0 min" — show an overdue
 * badge from {@link ServiceClock.overdue}, which is exact.
 */
export function formatWorkingDuration(ms: number, options: { dayMs?: number } = {}): string {
  if (typeof ms !== 'number' || !Number.isFinite(ms)) {
    throw new CalcInputError('ms', `duration must be a number of milliseconds (got ${ms})`)
  }
  const dayMs = options.dayMs ?? WORKING_DAY_MS
  if (!Number.isFinite(dayMs) || dayMs < MINUTE_MS || dayMs % MINUTE_MS !== 0) {
    throw new CalcInputError('dayMs', `dayMs must be a whole number of minutes in ms (got ${dayMs})`)
  }
  const minutes = Math.round(Math.abs(ms) / MINUTE_MS)
  if (minutes === 0) return '0 min'
  const dayMinutes = dayMs / MINUTE_MS
  const d = Math.floor(minutes / dayMinutes)
  const h = Math.floor((minutes % dayMinutes) / 60)
  const m = (minutes % dayMinutes) % 60
  const parts = [d ? `${d} d` : '', h ? `${h} h` : '', m ? `${m} min` : ''].filter(Boolean)
  return ms < 0 ? `${parts.join(' ')} overdue` : parts.join(' ')
}
