/**
 * Summary statistics for the manager's turnaround figures. Pure functions over plain numbers: the server
 * feeds them working-time durations, the tests feed them hand-worked lists. An empty list has no median,
 * percentile or share — those answer `null` (shown as "—"), never NaN.
 */

function sortedCopy(values: readonly number[], field: string): number[] {
  for (const v of values) {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new TypeError(`${field} must hold finite numbers only (got ${v})`)
  }
  return [...values].sort((a, b) => a - b)
}

/**
 * The median: the middle value of the sorted list, or the mean of the two middle values when the count is
 * even (common practice; e.g. [1, 2, 3, 10] → 2.5).
 */
export function median(values: readonly number[]): number | null {
  const s = sortedCopy(values, 'values')
  if (!s.length) return null
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

/**
 * The p-th percentile by the nearest-rank method: the smallest value in the list such that at least p % of
 * the values are at or below it — rank ⌈p/100 · n⌉ in the sorted list (1-based), rank 1 for p = 0. Always a
 * value that occurred (no interpolation), so "90 % of answers came within P90" holds exactly.
 * E.g. P90 of ten values is the 9th smallest; of five values, the 5th (⌈4.5⌉).
 */
export function percentile(values: readonly number[], p: number): number | null {
  if (typeof p !== 'number' || !Number.isFinite(p) || p < 0 || p > 100) throw new RangeError(`percentile p must be between 0 and 100 (got ${p})`)
  const s = sortedCopy(values, 'values')
  if (!s.length) return null
  const rank = Math.max(1, Math.ceil((p / 100) * s.length - 1e-9))
  return s[rank - 1]!
}

/** How many values are within a limit (at or under it — met exactly is met), and that share of all values. */
export function shareWithin(values: readonly number[], limit: number): { n: number, within: number, share: number | null } {
  if (typeof limit !== 'number' || !Number.isFinite(limit)) throw new TypeError(`limit must be a finite number (got ${limit})`)
  const s = sortedCopy(values, 'values')
  const within = s.filter(v => v <= limit).length
  return { n: s.length, within, share: s.length ? within / s.length : null }
}

/** Backlog age bands in whole working days since receipt. */
export const ageBands = ['0-2', '3-5', '6-10', '>10'] as const
export type AgeBand = typeof ageBands[number]
export const ageBandLabels: Record<AgeBand, string> = {
  '0-2': '0–2 working days',
  '3-5': '3–5 working days',
  '6-10': '6–10 working days',
  '>10': 'More than 10',
}

/** Lower bound of each band in whole working days: an age of 2.9 days is "2 days", band 0–2. */
export const ageBandStarts: Record<AgeBand, number> = { '0-2': 0, '3-5': 3, '6-10': 6, '>10': 11 }

/** The band of an age given in working days (fractions count down to the whole day begun). */
export function ageBand(workingDays: number): AgeBand {
  if (typeof workingDays !== 'number' || !Number.isFinite(workingDays) || workingDays < 0) {
    throw new RangeError(`age must be zero or more working days (got ${workingDays})`)
  }
  const whole = Math.floor(workingDays)
  if (whole <= 2) return '0-2'
  if (whole <= 5) return '3-5'
  if (whole <= 10) return '6-10'
  return '>10'
}

/** ISO 8601 week of a calendar date `YYYY-MM-DD`, written `2026-W05` (weeks start on Monday; week 1 holds 4 January). */
export function isoWeekOf(localDate: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate)
  if (!m) throw new RangeError(`date must be written YYYY-MM-DD (got ${localDate})`)
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])))
  const weekday = d.getUTCDay() || 7
  d.setUTCDate(d.getUTCDate() + 4 - weekday) // the Thursday of the same week decides the year
  const year = d.getUTCFullYear()
  const week = Math.ceil(((d.getTime() - Date.UTC(year, 0, 1)) / 86_400_000 + 1) / 7)
  return `${year}-W${String(week).padStart(2, '0')}`
}

/** Milliseconds to hours, two decimals; null stays null. */
export function toHours(ms: number | null): number | null {
  return ms === null ? null : Math.round((ms / 3_600_000) * 100) / 100
}
