import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { CalcInputError } from '../../shared/calc/errors'
import {
  WORKING_DAY_MS,
  addWorkingTime,
  anyHoliday,
  defaultCalendar,
  defaultServiceTargets,
  formatWorkingDuration,
  irishPublicHolidays,
  isIrishPublicHoliday,
  localDateOf,
  serviceClock,
  workingDayMs,
  workingMsBetween,
  workingWindow,
  type Pause,
  type WorkingCalendar,
} from '../../shared/time/working-time'

const H = 3_600_000
const MIN = 60_000
const cal = defaultCalendar()
const at = (iso: string) => new Date(iso)
const pause = (from: string, to: string | null): Pause => ({ from: at(from), to: to === null ? null : at(to) })

// Irish public holidays (Organisation of Working Time Act 1997, Sch. 2, as amended for St Brigid's Day) are
// published fact; the dates below are what the Act's rules give for 2026. Easter Sunday 2026 is 5 April.
// Ireland keeps GMT in winter and IST (UTC+1) from the last Sunday in March to the last Sunday in October
// (Standard Time Act 1968 with the EU summer-time directive 2000/84/EC): 29 Mar and 25 Oct in 2026.

describe('Irish public holidays from date-holidays', () => {
  it('lists exactly the ten public holidays of 2026 under the Act', () => {
    expect(irishPublicHolidays(2026)).toEqual([
      { date: '2026-01-01', name: 'New Year\'s Day' },
      { date: '2026-02-02', name: 'St. Brigid’s Day' }, // first Monday in February
      { date: '2026-03-17', name: 'St. Patrick’s Day' }, // a Tuesday
      { date: '2026-04-06', name: 'Easter Monday' },
      { date: '2026-05-04', name: 'First Monday in May' },
      { date: '2026-06-01', name: 'First Monday in June' },
      { date: '2026-08-03', name: 'First Monday in August' },
      { date: '2026-10-26', name: 'Last Monday in October' },
      { date: '2026-12-25', name: 'Christmas Day' },
      { date: '2026-12-26', name: 'St. Stephen’s Day' }, // a Saturday
    ])
  })

  it.each([
    ['St Brigid\'s Day 2026 on the first Monday in February', '2026-02-02', true],
    ['St Brigid\'s Day 2030 on 1 February because it is a Friday (Act as amended)', '2030-02-01', true],
    ['the Monday after 1 Feb 2030 is then an ordinary day', '2030-02-04', false],
    ['St Patrick\'s Day 2026, a Tuesday', '2026-03-17', true],
    ['Good Friday 2026 is not a public holiday in Ireland (the lib marks it "bank")', '2026-04-03', false],
    ['Monday 28 Dec 2026 after St Stephen\'s Day on a Saturday: no statutory substitute (lib: "bank")', '2026-12-28', false],
    ['Christmas Eve 2026 is an ordinary day', '2026-12-24', false],
    ['St Brigid\'s Day did not exist before 2023', '2022-02-07', false],
  ])('%s', (_case, date, expected) => {
    expect(isIrishPublicHoliday(date)).toBe(expected)
  })
})

describe('opening hours in the department\'s zone (Intl, DST-aware)', () => {
  it.each([
    ['Friday before the spring change: 09:00 GMT is 09:00Z', '2026-03-27', '2026-03-27T09:00:00.000Z', '2026-03-27T17:30:00.000Z'],
    ['Monday after the spring change: 09:00 IST is 08:00Z', '2026-03-30', '2026-03-30T08:00:00.000Z', '2026-03-30T16:30:00.000Z'],
    ['midsummer: 09:00 IST is 08:00Z', '2026-07-15', '2026-07-15T08:00:00.000Z', '2026-07-15T16:30:00.000Z'],
    ['Friday before the autumn change: still 08:00Z', '2026-10-23', '2026-10-23T08:00:00.000Z', '2026-10-23T16:30:00.000Z'],
    ['Tuesday after the autumn change: back to 09:00Z', '2026-10-27', '2026-10-27T09:00:00.000Z', '2026-10-27T17:30:00.000Z'],
  ])('%s', (_case, date, open, close) => {
    expect(workingWindow(date, cal)).toEqual({ open: at(open), close: at(close) })
  })

  it.each([
    ['a Saturday', '2026-03-28'],
    ['the Sunday the clocks go forward', '2026-03-29'],
    ['St Patrick\'s Day', '2026-03-17'],
    ['the October bank holiday, the day after the clocks go back', '2026-10-26'],
  ])('is closed on %s', (_case, date) => {
    expect(workingWindow(date, cal)).toBeNull()
  })

  it.each([
    // US summer time starts on the second Sunday in March (Energy Policy Act 2005): 8 March 2026.
    ['New York before its change: 09:00 EST is 14:00Z', '2026-03-06', '2026-03-06T14:00:00.000Z'],
    ['New York after its change: 09:00 EDT is 13:00Z', '2026-03-09', '2026-03-09T13:00:00.000Z'],
  ])('follows another zone: %s', (_case, date, open) => {
    const ny = defaultCalendar({ timeZone: 'America/New_York', holidays: new Set() })
    expect(workingWindow(date, ny)?.open).toEqual(at(open))
  })

  it.each([
    ['late evening in summer is already the next local day', '2026-07-15T23:30:00.000Z', '2026-07-16'],
    ['late evening in winter is still the same day', '2026-01-15T23:30:00.000Z', '2026-01-15'],
  ])('localDateOf: %s', (_case, iso, date) => {
    expect(localDateOf(at(iso), 'Europe/Dublin')).toBe(date)
  })
})

describe('workingMsBetween', () => {
  it.each([
    ['within one day: Wed 10:00 to 12:30', '2026-01-14T10:00:00Z', '2026-01-14T12:30:00Z', 2.5 * H],
    ['one day, from before opening to after closing, counts the 8.5 h day', '2026-01-14T07:00:00Z', '2026-01-14T20:00:00Z', 8.5 * H],
    ['wholly in the evening counts nothing', '2026-01-14T18:00:00Z', '2026-01-14T23:00:00Z', 0],
    ['across a weekend: Fri 15:00 to Mon 11:00 = 2.5 h + 2 h', '2026-01-16T15:00:00Z', '2026-01-19T11:00:00Z', 4.5 * H],
    ['a whole week Mon 09:00 to Mon 09:00 = 5 × 8.5 h', '2026-01-12T09:00:00Z', '2026-01-19T09:00:00Z', 42.5 * H],
    ['across St Patrick\'s Day (Tue 17 Mar 2026): Mon 12:00 to Wed 12:00 = 5.5 h + 0 + 3 h', '2026-03-16T12:00:00Z', '2026-03-18T12:00:00Z', 8.5 * H],
    ['across St Brigid\'s Day (Mon 2 Feb 2026): Fri 09:00 to Tue 09:00 is Friday only', '2026-01-30T09:00:00Z', '2026-02-03T09:00:00Z', 8.5 * H],
    ['across the August holiday (Mon 3 Aug 2026), in IST: Fri 16:00 to Tue 10:00 local = 1.5 h + 1 h', '2026-07-31T15:00:00Z', '2026-08-04T09:00:00Z', 2.5 * H],
    ['over Christmas 2026: Thu 24 Dec and Mon 28 Dec worked, 25–26 Dec closed', '2026-12-24T09:00:00Z', '2026-12-29T09:00:00Z', 17 * H],
    ['spring DST weekend: Fri 09:00 GMT to Mon 09:00 IST is Friday only', '2026-03-27T09:00:00Z', '2026-03-30T08:00:00Z', 8.5 * H],
    ['spring DST weekend: Fri 12:00Z to Mon 12:00Z = 5.5 h + (09:00–13:00 IST) 4 h', '2026-03-27T12:00:00Z', '2026-03-30T12:00:00Z', 9.5 * H],
    ['autumn DST weekend, Monday a holiday: Fri 12:00Z (13:00 IST) to Mon 12:00Z = 4.5 h', '2026-10-23T12:00:00Z', '2026-10-26T12:00:00Z', 4.5 * H],
    ['autumn DST weekend to Tuesday: Fri 13:00 IST to Tue 12:00 GMT = 4.5 h + 0 + 3 h', '2026-10-23T12:00:00Z', '2026-10-27T12:00:00Z', 7.5 * H],
    ['the week the clocks go forward: Mon 23 Mar 09:00 GMT to Mon 30 Mar 09:00 IST = 5 × 8.5 h', '2026-03-23T09:00:00Z', '2026-03-30T08:00:00Z', 42.5 * H],
    ['a reversed span has no working time', '2026-01-14T12:00:00Z', '2026-01-14T10:00:00Z', 0],
  ])('%s', (_case, start, end, expected) => {
    expect(workingMsBetween(at(start), at(end), cal)).toBe(expected)
  })

  // Mon 12 Jan 09:00 to Fri 16 Jan 17:30 2026 (GMT) is 42.5 working hours before pauses.
  const weekStart = at('2026-01-12T09:00:00Z')
  const weekEnd = at('2026-01-16T17:30:00Z')
  it.each([
    ['one pause Tue 12:00 to Wed 12:00 takes 5.5 h + 3 h', [pause('2026-01-13T12:00:00Z', '2026-01-14T12:00:00Z')], 34 * H],
    ['overlapping pauses Tue 12:00–Wed 12:00 and Wed 10:00–Thu 10:00 count once: 5.5 + 8.5 + 1 h', [
      pause('2026-01-13T12:00:00Z', '2026-01-14T12:00:00Z'),
      pause('2026-01-14T10:00:00Z', '2026-01-15T10:00:00Z'),
    ], 27.5 * H],
    ['a pause inside another counts once: Tue 10:00–16:00 holds Tue 11:00–12:00', [
      pause('2026-01-13T11:00:00Z', '2026-01-13T12:00:00Z'),
      pause('2026-01-13T10:00:00Z', '2026-01-13T16:00:00Z'),
    ], 36.5 * H],
    ['an open-ended pause from Thu 14:00 runs to the end: 3.5 h + 8.5 h', [pause('2026-01-15T14:00:00Z', null)], 30.5 * H],
    ['a pause on the weekend changes nothing', [pause('2026-01-10T10:00:00Z', '2026-01-11T18:00:00Z')], 42.5 * H],
    ['a pause begun before the span is clipped to it: Sun to Mon 10:00 takes 1 h', [pause('2026-01-11T10:00:00Z', '2026-01-12T10:00:00Z')], 41.5 * H],
  ])('pauses: %s', (_case, pauses, expected) => {
    expect(workingMsBetween(weekStart, weekEnd, cal, pauses)).toBe(expected)
  })
})

describe('addWorkingTime (the due time)', () => {
  it.each([
    ['4 h from Wed 10:00 is Wed 14:00', '2026-01-14T10:00:00Z', 4 * H, '2026-01-14T14:00:00Z'],
    ['a target ending at closing time is due at closing, not next morning', '2026-01-14T09:00:00Z', 8.5 * H, '2026-01-14T17:30:00Z'],
    ['received in the evening: 4 h from Tue 19:00 is Wed 13:00', '2026-01-13T19:00:00Z', 4 * H, '2026-01-14T13:00:00Z'],
    ['received before opening: 1 h from Mon 06:00 is Mon 10:00', '2026-01-19T06:00:00Z', 1 * H, '2026-01-19T10:00:00Z'],
    ['received on a Saturday: 2 working days run Mon and Tue, due Tue 17:30', '2026-01-17T10:00:00Z', 2 * WORKING_DAY_MS, '2026-01-20T17:30:00Z'],
    ['received Fri evening before St Patrick\'s week: 5 days skip Tue 17 Mar, due Mon 23 Mar 17:30', '2026-03-13T18:00:00Z', 5 * WORKING_DAY_MS, '2026-03-23T17:30:00Z'],
    ['over the spring change: 1 h from Fri 17:00 GMT is half an hour Friday and half an hour from 09:00 IST Monday = 08:30Z', '2026-03-27T17:00:00Z', 1 * H, '2026-03-30T08:30:00Z'],
    ['over the autumn change and the October holiday: 1 h from Fri 17:00 IST is Tue 09:30 GMT', '2026-10-23T16:00:00Z', 1 * H, '2026-10-27T09:30:00Z'],
    ['nothing to wait for: 0 ms is the start itself, even outside hours', '2026-01-17T10:00:00Z', 0, '2026-01-17T10:00:00Z'],
  ])('%s', (_case, start, ms, expected) => {
    expect(addWorkingTime(at(start), ms, cal)).toEqual(at(expected))
  })

  it.each([
    ['a pause Mon 10:00 to Tue 10:00 moves a 2-day target from Tue 17:30 to Wed 17:30', [pause('2026-01-12T10:00:00Z', '2026-01-13T10:00:00Z')], '2026-01-14T17:30:00Z'],
    ['overlapping pauses Mon 10:00–12:00 and Mon 11:00–13:00 move it by 3 h, past closing, to Wed 12:00', [
      pause('2026-01-12T10:00:00Z', '2026-01-12T12:00:00Z'),
      pause('2026-01-12T11:00:00Z', '2026-01-12T13:00:00Z'),
    ], '2026-01-14T12:00:00Z'],
    ['a pause that overnight ends before opening moves nothing', [pause('2026-01-12T18:00:00Z', '2026-01-13T08:00:00Z')], '2026-01-13T17:30:00Z'],
  ])('with pauses: %s', (_case, pauses, expected) => {
    expect(addWorkingTime(at('2026-01-12T09:00:00Z'), 2 * WORKING_DAY_MS, cal, pauses)).toEqual(at(expected))
  })

  // Instants between 2025 and the end of 2027, so the cases cross both DST changes and every holiday.
  const base = Date.UTC(2025, 0, 1)
  const span = 3 * 365 * 24 * H
  const instant = fc.integer({ min: 0, max: span }).map(n => new Date(base + n))
  const pauses = fc.array(
    fc.tuple(fc.integer({ min: 0, max: span }), fc.integer({ min: 0, max: 10 * 24 * H }))
      .map(([from, length]) => ({ from: new Date(base + from), to: new Date(base + from + length) })),
    { maxLength: 4 },
  )
  const amount = fc.integer({ min: 0, max: 30 * WORKING_DAY_MS })

  it('is the inverse of workingMsBetween, and the due time is the earliest such instant (property)', () => {
    fc.assert(fc.property(instant, amount, pauses, (start, ms, ps) => {
      const due = addWorkingTime(start, ms, cal, ps)
      expect(workingMsBetween(start, due, cal, ps)).toBe(ms)
      if (ms > 0) expect(workingMsBetween(start, new Date(due.getTime() - 1), cal, ps)).toBe(ms - 1)
    }), { numRuns: 300 })
  })

  it('adds up over consecutive spans and never exceeds the clock time (property)', () => {
    fc.assert(fc.property(instant, instant, instant, (x, y, z) => {
      const [a, b, c] = [x, y, z].sort((p, q) => p.getTime() - q.getTime()) as [Date, Date, Date]
      const ab = workingMsBetween(a, b, cal)
      expect(workingMsBetween(a, c, cal)).toBe(ab + workingMsBetween(b, c, cal))
      expect(ab).toBeGreaterThanOrEqual(0)
      expect(ab).toBeLessThanOrEqual(b.getTime() - a.getTime())
    }), { numRuns: 200 })
  })
})

describe('serviceClock', () => {
  const normal = defaultServiceTargets.normal
  const urgent = defaultServiceTargets.urgent
  const received = at('2026-01-12T09:00:00Z') // Monday, GMT

  it.each([
    {
      case: 'running normally: first response (2 d) on Tue morning, 8.5 h + 1 h elapsed',
      target: normal.firstResponseMs, now: '2026-01-13T10:00:00Z', pauses: [], stoppedAt: null,
      dueAt: '2026-01-13T17:30:00Z', elapsed: 9.5 * H, overdue: false, paused: false, stopped: false,
    },
    {
      case: 'overdue: urgent (4 h) received Mon 09:00, now Mon 15:10 → 2 h 10 min over',
      target: urgent.answerMs, now: '2026-01-12T15:10:00Z', pauses: [], stoppedAt: null,
      dueAt: '2026-01-12T13:00:00Z', elapsed: 6 * H + 10 * MIN, overdue: true, paused: false, stopped: false,
    },
    {
      case: 'waiting on the requester since Mon 12:00, now Wed 12:00: the due time moves from Tue to Thu 17:30',
      target: normal.firstResponseMs, now: '2026-01-14T12:00:00Z', pauses: [pause('2026-01-12T12:00:00Z', null)], stoppedAt: null,
      dueAt: '2026-01-15T17:30:00Z', elapsed: 3 * H, overdue: false, paused: true, stopped: false,
    },
    {
      case: 'a finished pause Mon 10:00–Tue 10:00 is left out: due Wed 17:30, 8.5 h elapsed by Wed 09:00',
      target: normal.firstResponseMs, now: '2026-01-14T09:00:00Z', pauses: [pause('2026-01-12T10:00:00Z', '2026-01-13T10:00:00Z')], stoppedAt: null,
      dueAt: '2026-01-14T17:30:00Z', elapsed: 8.5 * H, overdue: false, paused: false, stopped: false,
    },
    {
      case: 'answered in time on Thu 12:00 (5-day target), looked at a week later',
      target: normal.answerMs, now: '2026-01-26T12:00:00Z', pauses: [], stoppedAt: '2026-01-15T12:00:00Z',
      dueAt: '2026-01-16T17:30:00Z', elapsed: 28.5 * H, overdue: false, paused: false, stopped: true,
    },
    {
      case: 'answered late on Mon 19 Jan 10:00: one working hour over',
      target: normal.answerMs, now: '2026-01-26T12:00:00Z', pauses: [], stoppedAt: '2026-01-19T10:00:00Z',
      dueAt: '2026-01-16T17:30:00Z', elapsed: 43.5 * H, overdue: true, paused: false, stopped: true,
    },
    {
      case: 'a pause opened after the answer does not move the due time or pause the clock',
      target: normal.firstResponseMs, now: '2026-01-14T12:00:00Z', pauses: [pause('2026-01-13T09:00:00Z', null)], stoppedAt: '2026-01-12T12:00:00Z',
      dueAt: '2026-01-13T17:30:00Z', elapsed: 3 * H, overdue: false, paused: false, stopped: true,
    },
  ])('$case', (c) => {
    const clock = serviceClock({
      receivedAt: received,
      targetWorkingMs: c.target,
      now: at(c.now),
      pauses: c.pauses,
      stoppedAt: c.stoppedAt === null ? null : at(c.stoppedAt),
      calendar: cal,
    })
    expect(clock).toEqual({
      dueAt: at(c.dueAt),
      elapsedWorkingMs: c.elapsed,
      remainingWorkingMs: c.target - c.elapsed,
      overdue: c.overdue,
      paused: c.paused,
      stopped: c.stopped,
    })
  })

  it.each([
    ['received Saturday, looked at on Saturday: nothing elapsed, urgent due Mon 13:00', '2026-01-17T10:00:00Z', '2026-01-17T12:00:00Z', '2026-01-19T13:00:00Z', 0, false],
    ['urgent received Mon 13:30 is due at 17:30; at 18:00 it is overdue with 0 working time left', '2026-01-12T13:30:00Z', '2026-01-12T18:00:00Z', '2026-01-12T17:30:00Z', 4 * H, true],
    ['received Fri 16:30 GMT before the spring change: 1 h Friday + 3 h Monday, due Mon 12:00 IST = 11:00Z; at 10:00 IST 2 h have run', '2026-03-27T16:30:00Z', '2026-03-30T09:00:00Z', '2026-03-30T11:00:00Z', 2 * H, false],
  ])('received outside hours or near the end: %s', (_case, receivedAt, now, dueAt, elapsed, overdue) => {
    const clock = serviceClock({ receivedAt: at(receivedAt), targetWorkingMs: urgent.answerMs, now: at(now), calendar: cal })
    expect(clock.dueAt).toEqual(at(dueAt))
    expect(clock.elapsedWorkingMs).toBe(elapsed)
    expect(clock.overdue).toBe(overdue)
  })

  it('formats the overdue urgent clock as the desk shows it', () => {
    const clock = serviceClock({ receivedAt: received, targetWorkingMs: urgent.answerMs, now: at('2026-01-12T15:10:00Z'), calendar: cal })
    expect(formatWorkingDuration(clock.remainingWorkingMs)).toBe('2 h 10 min overdue')
  })
})

describe('service-target policy and working-day length', () => {
  it.each([
    ['normal first response: 2 working days of 8.5 h', defaultServiceTargets.normal.firstResponseMs, 17 * H],
    ['normal answer: 5 working days of 8.5 h', defaultServiceTargets.normal.answerMs, 42.5 * H],
    ['urgent first response: 4 working hours', defaultServiceTargets.urgent.firstResponseMs, 4 * H],
    ['urgent answer: 4 working hours', defaultServiceTargets.urgent.answerMs, 4 * H],
    ['one default working day, 09:00–17:30', WORKING_DAY_MS, 8.5 * H],
    ['a day of a calendar open 08:00–16:00', workingDayMs(defaultCalendar({ dayStart: '08:00', dayEnd: '16:00' })), 8 * H],
  ])('%s', (_case, value, expected) => {
    expect(value).toBe(expected)
  })

  it('lets a department add its own closing days to the public holidays', () => {
    const withEve = defaultCalendar({ holidays: anyHoliday(isIrishPublicHoliday, new Set(['2026-12-24'])) })
    // Thu 24 Dec now closed as well as 25–26 Dec, so only Mon 28 Dec counts.
    expect(workingMsBetween(at('2026-12-24T09:00:00Z'), at('2026-12-29T09:00:00Z'), withEve)).toBe(8.5 * H)
  })
})

describe('formatWorkingDuration', () => {
  it.each([
    ['nothing', 0, undefined, '0 min'],
    ['under half a minute rounds to nothing', 20_000, undefined, '0 min'],
    ['40 s rounds to a minute', 40_000, undefined, '1 min'],
    ['minutes only', 15 * MIN, undefined, '15 min'],
    ['whole hours only', 4 * H, undefined, '4 h'],
    ['hours and minutes', 3 * H + 15 * MIN, undefined, '3 h 15 min'],
    ['one 8.5 h working day', 8.5 * H, undefined, '1 d'],
    ['a day, hours and minutes', 8.5 * H + 3 * H + 15 * MIN, undefined, '1 d 3 h 15 min'],
    ['a day and minutes, no zero hours', 8.5 * H + 5 * MIN, undefined, '1 d 5 min'],
    ['overdue', -(3 * H + 10 * MIN), undefined, '3 h 10 min overdue'],
    ['days of another calendar (8 h)', 9 * H, 8 * H, '1 d 1 h'],
  ])('%s', (_case, ms, dayMs, expected) => {
    expect(formatWorkingDuration(ms, dayMs === undefined ? {} : { dayMs })).toBe(expected)
  })
})

describe('bad input is refused with a message naming the field', () => {
  const bad = (overrides: Partial<WorkingCalendar>) => () => defaultCalendar(overrides)
  const d = at('2026-01-12T09:00:00Z')
  it.each([
    ['dayStart without a leading zero', bad({ dayStart: '9:00' }), 'dayStart'],
    ['dayStart at 25:00', bad({ dayStart: '25:00' }), 'dayStart'],
    ['dayEnd before dayStart', bad({ dayStart: '17:00', dayEnd: '09:00' }), 'dayEnd'],
    ['no work days', bad({ workDays: [] }), 'workDays'],
    ['weekday 0', bad({ workDays: [0, 1] }), 'workDays'],
    ['an unknown time zone', bad({ timeZone: 'Mars/Olympus' }), 'timeZone'],
    ['an invalid start', () => workingMsBetween(new Date('nonsense'), d, cal), 'start'],
    ['a negative amount of working time', () => addWorkingTime(d, -1, cal), 'workingMs'],
    ['an open pause when asking for a due time', () => addWorkingTime(d, H, cal, [pause('2026-01-12T10:00:00Z', null)]), 'pauses[0].to'],
    ['a pause that ends before it starts', () => workingMsBetween(d, at('2026-01-13T09:00:00Z'), cal, [pause('2026-01-12T12:00:00Z', '2026-01-12T11:00:00Z')]), 'pauses[0].to'],
    ['a zero target', () => serviceClock({ receivedAt: d, targetWorkingMs: 0, now: d, calendar: cal }), 'targetWorkingMs'],
    ['a date that is not in the calendar', () => workingWindow('2026-02-30', cal), 'localDate'],
    ['an infinite duration to format', () => formatWorkingDuration(Number.POSITIVE_INFINITY), 'ms'],
  ])('%s', (_case, run, field) => {
    expect(run).toThrow(CalcInputError)
    try {
      run()
    }
    catch (e) {
      expect((e as CalcInputError).field).toBe(field)
    }
  })

  it('gives up on a calendar closed every day instead of looping forever', () => {
    const closed = defaultCalendar({ holidays: () => true })
    expect(() => addWorkingTime(d, H, closed)).toThrow(/no working hours/)
  })
})
