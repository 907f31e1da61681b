import { localDateOf } from '../time/working-time'
import type { TurnaroundPeriod } from '../schemas/turnaround'
import { isoWeekOf } from './stats'

/**
 * The span of a turnaround period as instants, from local dates in the department's time zone: weeks run
 * Monday 00:00 to Monday 00:00 local time, so a week that holds a clock change is still one week.
 * `week` is this ISO week, `4-weeks` this week and the three before it, `quarter` this week and the twelve
 * before it (13 weeks, a quarter of a year), `custom` the chosen days, both included.
 */
export interface ResolvedPeriod {
  kind: TurnaroundPeriod
  /** First local day, `YYYY-MM-DD`. */
  fromDate: string
  /** Last local day, included. */
  toDate: string
  /** Local midnight at the start of `fromDate`. */
  start: Date
  /** Local midnight after `toDate` (the end is excluded). */
  end: Date
  /** The ISO weeks the period touches, oldest first, with each week's bounds as instants. */
  weeks: { week: string, startDate: string, start: Date, end: Date }[]
}

const DAY_MS = 86_400_000

function dateToDay(localDate: string): number {
  return Date.parse(`${localDate}T00:00:00Z`) / DAY_MS
}
function dayToDate(day: number): string {
  return new Date(day * DAY_MS).toISOString().slice(0, 10)
}

const offsetFormatters = new Map<string, Intl.DateTimeFormat>()
function offsetAt(instant: number, timeZone: string): number {
  let f = offsetFormatters.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' })
    offsetFormatters.set(timeZone, f)
  }
  const p: Record<string, number> = {}
  for (const part of f.formatToParts(instant)) if (part.type !== 'literal') p[part.type] = Number(part.value)
  return Date.UTC(p.year!, p.month! - 1, p.day!, p.hour!, p.minute!, p.second!) - Math.floor(instant / 1000) * 1000
}

/** The instant of local midnight starting `localDate` in `timeZone` (Irish clocks change at 01:00/02:00, never at midnight). */
export function localMidnight(localDate: string, timeZone: string): Date {
  const wall = dateToDay(localDate) * DAY_MS
  let t = wall - offsetAt(wall, timeZone)
  t = wall - offsetAt(t, timeZone)
  return new Date(t)
}

/** Monday of the ISO week holding `localDate`. */
export function mondayOf(localDate: string): string {
  const day = dateToDay(localDate)
  const isoWeekday = ((((day + 3) % 7) + 7) % 7) + 1 // 1970-01-01 was a Thursday
  return dayToDate(day - (isoWeekday - 1))
}

export function resolvePeriod(
  q: { period: TurnaroundPeriod, from?: string, to?: string },
  now: Date,
  timeZone: string,
): ResolvedPeriod {
  const today = localDateOf(now, timeZone)
  const thisMonday = dateToDay(mondayOf(today))
  let fromDay: number
  let toDay: number
  if (q.period === 'custom') {
    if (!q.from || !q.to) throw new RangeError('a custom period needs from and to')
    fromDay = dateToDay(q.from)
    toDay = dateToDay(q.to)
  }
  else {
    const weeks = q.period === 'week' ? 1 : q.period === '4-weeks' ? 4 : 13
    fromDay = thisMonday - 7 * (weeks - 1)
    toDay = thisMonday + 6
  }
  const weeks: ResolvedPeriod['weeks'] = []
  for (let monday = dateToDay(mondayOf(dayToDate(fromDay))); monday <= toDay; monday += 7) {
    const startDate = dayToDate(Math.max(monday, fromDay))
    const endDate = dayToDate(Math.min(monday + 7, toDay + 1))
    weeks.push({ week: isoWeekOf(dayToDate(monday)), startDate, start: localMidnight(startDate, timeZone), end: localMidnight(endDate, timeZone) })
  }
  return {
    kind: q.period,
    fromDate: dayToDate(fromDay),
    toDate: dayToDate(toDay),
    start: localMidnight(dayToDate(fromDay), timeZone),
    end: localMidnight(dayToDate(toDay + 1), timeZone),
    weeks,
  }
}
