import { describe, expect, it } from 'vitest'
import { csvField, toCsv } from '../../shared/turnaround/csv'
import { localMidnight, mondayOf, resolvePeriod } from '../../shared/turnaround/period'
import { ageBand, isoWeekOf, median, percentile, shareWithin } from '../../shared/turnaround/stats'

describe('median', () => {
  // common practice: the middle value, or the mean of the two middle values for an even count
  it.each([
    { values: [], expected: null },
    { values: [7], expected: 7 },
    { values: [3, 1, 2], expected: 2 }, // sorted 1 2 3 → 2
    { values: [10, 1, 3, 2], expected: 2.5 }, // sorted 1 2 3 10 → (2 + 3) / 2
    { values: [4, 4, 4, 4], expected: 4 },
    { values: [1.5, 8.5, 2, 17, 3.25], expected: 3.25 }, // sorted 1.5 2 3.25 8.5 17
  ])('median($values) = $expected', ({ values, expected }) => {
    expect(median(values)).toBe(expected)
  })
})

describe('percentile, nearest rank', () => {
  // common practice (nearest-rank definition): rank = ceil(p/100 · n), 1-based, in the sorted list
  const ten = [9, 1, 8, 2, 7, 3, 6, 4, 10, 5] // sorted 1..10
  it.each([
    { values: ten, p: 90, expected: 9 }, // ceil(0.9 · 10) = 9 → 9th value = 9
    { values: ten, p: 50, expected: 5 }, // ceil(5) = 5 → 5
    { values: ten, p: 100, expected: 10 },
    { values: ten, p: 0, expected: 1 }, // rank 1
    { values: [2, 4, 6, 8, 10], p: 90, expected: 10 }, // ceil(4.5) = 5 → 10
    { values: [2, 4, 6, 8, 10], p: 20, expected: 2 }, // ceil(1.0) = 1 → 2
    { values: [2, 4, 6, 8, 10], p: 21, expected: 4 }, // ceil(1.05) = 2 → 4
    { values: [5, 1, 3], p: 90, expected: 5 }, // ceil(2.7) = 3 → 5
    { values: [], p: 90, expected: null },
  ])('P$p of $values = $expected', ({ values, p, expected }) => {
    expect(percentile(values, p)).toBe(expected)
  })
  it.each([-1, 101, Number.NaN])('refuses p = %s', (p) => {
    expect(() => percentile([1], p)).toThrow(/between 0 and 100/)
  })
  it('refuses a list holding NaN', () => {
    expect(() => percentile([1, Number.NaN], 50)).toThrow(/finite numbers/)
  })
})

describe('share within target', () => {
  // common practice: a time equal to the target meets it
  it.each([
    { values: [1, 2, 3, 4], limit: 2, within: 2, share: 0.5 },
    { values: [1, 2, 3, 4], limit: 4, within: 4, share: 1 },
    { values: [5, 6, 7], limit: 4, within: 0, share: 0 },
    { values: [3, 8, 2], limit: 3, within: 2, share: 2 / 3 }, // 3 and 2 are within, 8 is not
    { values: [], limit: 4, within: 0, share: null },
  ])('$values within $limit: $within ($share)', ({ values, limit, within, share }) => {
    expect(shareWithin(values, limit)).toEqual({ n: values.length, within, share })
  })
})

describe('age bands in working days', () => {
  it.each([
    [0, '0-2'], [2.99, '0-2'], [3, '3-5'], [5.5, '3-5'], [6, '6-10'], [10.9, '6-10'], [11, '>10'], [40, '>10'],
  ] as const)('%s days → %s', (days, band) => {
    expect(ageBand(days)).toBe(band)
  })
  it('refuses a negative age', () => {
    expect(() => ageBand(-1)).toThrow(/zero or more/)
  })
})

describe('ISO weeks and periods', () => {
  // published: ISO 8601 week numbering — 2026-01-01 is a Thursday, so it is in 2026-W01; 2027-01-01 (Friday) is in 2026-W53
  it.each([
    ['2026-01-01', '2026-W01'], ['2025-12-29', '2026-W01'], ['2026-12-31', '2026-W53'], ['2027-01-01', '2026-W53'],
    ['2027-01-04', '2027-W01'], ['2026-11-30', '2026-W49'], ['2024-12-30', '2025-W01'],
  ])('%s is in %s', (date, week) => {
    expect(isoWeekOf(date)).toBe(week)
  })
  it('finds the Monday of a week', () => {
    expect(mondayOf('2026-12-02')).toBe('2026-11-30')
    expect(mondayOf('2026-11-30')).toBe('2026-11-30')
    expect(mondayOf('2026-12-06')).toBe('2026-11-30')
  })
  it('places local midnight in Dublin in winter (UTC+0) and summer (UTC+1)', () => {
    expect(localMidnight('2026-12-02', 'Europe/Dublin').toISOString()).toBe('2026-12-02T00:00:00.000Z')
    expect(localMidnight('2026-07-01', 'Europe/Dublin').toISOString()).toBe('2026-06-30T23:00:00.000Z')
  })
  it('resolves last 4 weeks as this ISO week and the three before', () => {
    const p = resolvePeriod({ period: '4-weeks' }, new Date('2026-12-02T10:00:00Z'), 'Europe/Dublin')
    expect([p.fromDate, p.toDate]).toEqual(['2026-11-09', '2026-12-06'])
    expect(p.weeks.map(w => w.week)).toEqual(['2026-W46', '2026-W47', '2026-W48', '2026-W49'])
    expect(p.end.toISOString()).toBe('2026-12-07T00:00:00.000Z')
  })
  it('keeps a week that holds the October clock change whole (Sunday 25 October 2026, clocks back)', () => {
    const p = resolvePeriod({ period: 'custom', from: '2026-10-19', to: '2026-10-25' }, new Date('2026-12-02T10:00:00Z'), 'Europe/Dublin')
    expect(p.start.toISOString()).toBe('2026-10-18T23:00:00.000Z') // IST, UTC+1
    expect(p.end.toISOString()).toBe('2026-10-26T00:00:00.000Z') // GMT again
    expect(p.weeks).toHaveLength(1)
  })
  it('cuts a custom period\'s weeks at its own days', () => {
    const p = resolvePeriod({ period: 'custom', from: '2026-11-04', to: '2026-11-18' }, new Date('2026-12-02T10:00:00Z'), 'Europe/Dublin')
    expect(p.weeks.map(w => [w.week, w.startDate])).toEqual([['2026-W45', '2026-11-04'], ['2026-W46', '2026-11-09'], ['2026-W47', '2026-11-16']])
    expect(p.weeks.at(-1)!.end.toISOString()).toBe('2026-11-19T00:00:00.000Z')
  })
})

describe('CSV', () => {
  // published: RFC 4180 §2 (quoting, doubled quotes, CRLF)
  it.each([
    ['plain', 'plain'], ['a,b', '"a,b"'], ['say "hi"', '"say ""hi"""'], ['two\nlines', '"two\nlines"'],
    ['=SUM(A1)', '\'=SUM(A1)'], ['-1+1', '\'-1+1'], [null, ''], [12.5, '12.5'], [-3, '-3'],
  ] as const)('%j → %s', (value, expected) => {
    expect(csvField(value)).toBe(expected)
  })
  it('joins rows with CRLF and ends with one', () => {
    expect(toCsv(['a', 'b'], [[1, 'x,y']])).toBe('a,b\r\n1,"x,y"\r\n')
  })
})
