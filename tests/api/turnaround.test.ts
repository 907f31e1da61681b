import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaultCalendar, serviceClock } from '../../shared/time/working-time'
import { pausesFromEvents, stoppedClockTimes } from '../../shared/time/stopped-clock'
import { call, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { useBuiltServer } from '../support/server'

/**
 * A small hand-made set of enquiries under an organisation of its own, so nothing else in the test database
 * moves these figures: every request below filters by that organisation.
 *
 * The week is Monday 9 – Friday 13 November 2026: no Irish public holiday, and Dublin is on GMT, so the local
 * times written here are also UTC. A working day is 09:00–17:30 (8.5 h). Normal priority only — its targets
 * are 17 working hours to a first response and 42.5 to the answer (the migration's 2 and 5 working days).
 *
 *      received        first response   answered          pause                   → first resp.  answer
 *  A   Mon 09:00       Mon 11:00        Mon 13:00                                     2 h          4 h
 *  B   Mon 14:00       Tue 10:00        Tue 15:00                                     3.5+1 = 4.5  3.5+6 = 9.5
 *  C   Tue 09:00       Tue 09:30        Thu 12:00         Tue 10:00 → Thu 10:00        0.5          1 + 2 = 3 (20 h with the pause)
 *  D   Wed 4 Nov 09:00 Thu 5 Nov 09:00  Wed 11 Nov 12:00                              (before)     8.5×5 + 3 = 45.5
 *  E   Wed 16:00       Fri 11:00        — (in hand, overdue)                          1.5+8.5+2 = 12
 *  F   Thu 09:00       Fri 17:00        Fri 17:30                                     8.5+8 = 16.5  17
 *  G   Fri 09:00       — (received, overdue, not assigned)
 *  H   Mon 10:00       Wed 11:00        Wed 12:00                                     7.5+8.5+2 = 18  19
 *  I   one hour ago    — (triaged, not yet due)
 *
 * First responses in the week (D's was before it): 0.5 2 4.5 12 16.5 18
 *   median (4.5 + 12) / 2 = 8.25 h; P90 nearest rank ⌈0.9 × 6⌉ = 6th = 18 h; within 17 h: 5 of 6.
 * Answers in the week: 3 4 9.5 17 19 45.5
 *   median (9.5 + 17) / 2 = 13.25 h; P90 6th = 45.5 h; within 42.5 h: 5 of 6.
 * Received in the week: A B C E F G H = 7. Closed in the week: A (Tue) and B (Fri) = 2.
 */
const d = (iso: string) => new Date(`${iso}Z`)
const ORG = 'Turnaround Check Ltd (test data, invented)'
const period = 'period=custom&from=2026-11-09&to=2026-11-13'

/** One CSV line back into its fields (RFC 4180 quoting). */
function splitCsvLine(line: string): string[] {
  const out: string[] = []
  let field = ''
  let quoted = false
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') { field += '"'; i++ }
      else if (ch === '"') quoted = false
      else field += ch
    }
    else if (ch === '"') quoted = true
    else if (ch === ',') { out.push(field); field = '' }
    else field += ch
  }
  out.push(field)
  return out
}

interface Row {
  key: string, status: string, topic?: string, assigned?: boolean, received: Date,
  first?: string, answered?: string, closed?: string, due?: Date | null
}

describe('turnaround figures', async () => {
  await useBuiltServer()
  let manager = ''
  let officer = ''
  let orgId = 0
  let officerId = 0
  const farFuture = new Date(Date.now() + 10 * 86_400_000)

  beforeAll(async () => {
    [manager, officer] = await Promise.all([signIn(demo.manager), signIn(demo.officer)])
    const db = testDb()
    const select = <T extends object>(sql: string, replacements: unknown[] = []) => db.query<T>(sql, { replacements, type: QueryTypes.SELECT })
    // A rerun against the same database starts clean.
    for (const old of await select<{ id: number }>('SELECT id FROM organisations WHERE name = ?', [ORG])) {
      await db.query('DELETE ev FROM enquiry_events ev JOIN enquiries e ON e.id = ev.enquiry_id WHERE e.organisation_id = ?', { replacements: [old.id] })
      await db.query('DELETE FROM enquiries WHERE organisation_id = ?', { replacements: [old.id] })
      await db.query('DELETE FROM organisations WHERE id = ?', { replacements: [old.id] })
    }
    await db.query('INSERT INTO organisations (name, kind, created_at, updated_at) VALUES (?, \'other\', NOW(3), NOW(3))', { replacements: [ORG] })
    orgId = (await select<{ id: number }>('SELECT id FROM organisations WHERE name = ?', [ORG]))[0]!.id
    officerId = (await select<{ id: number }>('SELECT id FROM users WHERE email = ?', [demo.officer]))[0]!.id
    const [{ seq }] = await select<{ seq: number | null }>('SELECT MAX(ref_seq) AS seq FROM enquiries WHERE ref_year = 1999') as [{ seq: number | null }]
    let next = Number(seq ?? 90000)

    const rows: Row[] = [
      { key: 'A', status: 'closed', received: d('2026-11-09T09:00'), first: '2026-11-09T11:00', answered: '2026-11-09T13:00', closed: '2026-11-10T09:00' },
      { key: 'B', status: 'closed', received: d('2026-11-09T14:00'), first: '2026-11-10T10:00', answered: '2026-11-10T15:00', closed: '2026-11-13T10:00' },
      { key: 'C', status: 'answered', topic: 'wind', received: d('2026-11-10T09:00'), first: '2026-11-10T09:30', answered: '2026-11-12T12:00' },
      { key: 'D', status: 'answered', received: d('2026-11-04T09:00'), first: '2026-11-05T09:00', answered: '2026-11-11T12:00' },
      { key: 'E', status: 'in_hand', received: d('2026-11-11T16:00'), first: '2026-11-13T11:00', due: d('2026-11-18T14:30') },
      { key: 'F', status: 'answered', received: d('2026-11-12T09:00'), first: '2026-11-13T17:00', answered: '2026-11-13T17:30' },
      { key: 'G', status: 'received', assigned: false, received: d('2026-11-13T09:00'), due: d('2026-11-16T17:30') },
      { key: 'H', status: 'answered', received: d('2026-11-09T10:00'), first: '2026-11-11T11:00', answered: '2026-11-11T12:00' },
      { key: 'I', status: 'triaged', received: new Date(Date.now() - 3_600_000), due: farFuture },
    ]
    const ids: Record<string, number> = {}
    for (const r of rows) {
      next += 1
      const ref = `TQ-1999-${next}`
      await db.query(
        `INSERT INTO enquiries (ref, ref_year, ref_seq, status, topic, priority, subject, question, requester_name, requester_email,
           organisation_id, assignee_id, received_at, first_response_at, answered_at, closed_at, next_due_at, last_activity_at, created_at, updated_at)
         VALUES (?, 1999, ?, ?, ?, 'normal', ?, 'A question made up for the turnaround figures test.', 'Test Requester', 'requester@turnaround.example',
           ?, ?, ?, ?, ?, ?, ?, NOW(3), NOW(3), NOW(3))`,
        { replacements: [ref, next, r.status, r.topic ?? 'thermal', `Turnaround check ${r.key}`, orgId, r.assigned === false ? null : officerId,
          r.received, r.first ? d(r.first) : null, r.answered ? d(r.answered) : null, r.closed ? d(r.closed) : null, r.due ?? null] },
      )
      ids[r.key] = (await select<{ id: number }>('SELECT id FROM enquiries WHERE ref = ?', [ref]))[0]!.id
    }
    // C waits on its requester from Tuesday 10:00 to Thursday 10:00; its other status changes do not pause the clock.
    const events: [string, string | null, string, string][] = [
      ['C', null, 'received', '2026-11-10T09:00'],
      ['C', 'received', 'in_hand', '2026-11-10T09:30'],
      ['C', 'in_hand', 'waiting_on_requester', '2026-11-10T10:00'],
      ['C', 'waiting_on_requester', 'in_hand', '2026-11-12T10:00'],
      ['C', 'in_hand', 'answered', '2026-11-12T12:00'],
      ['B', 'in_hand', 'answered', '2026-11-10T15:00'],
    ]
    for (const [key, from, to, at] of events) {
      await db.query('INSERT INTO enquiry_events (enquiry_id, kind, from_value, to_value, created_at) VALUES (?, \'status\', ?, ?, ?)',
        { replacements: [ids[key], from, to, d(at)] })
    }
  })
  afterAll(closeTestDb)

  it('works from the migration\'s normal-priority targets (17 h and 42.5 h)', async () => {
    const [t] = await testDb().query<{ first_response_minutes: number, answer_minutes: number }>(
      'SELECT first_response_minutes, answer_minutes FROM service_targets WHERE priority = \'normal\'', { type: QueryTypes.SELECT })
    expect(t).toMatchObject({ first_response_minutes: 1020, answer_minutes: 2550 })
  })

  it('gives the hand-worked medians, P90s and shares within target, with the wait on the requester left out', async () => {
    const res = await call(`/api/turnaround?${period}&organisation=${orgId}`, { cookie: manager })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const b = res.body
    expect(b.period).toMatchObject({ fromDate: '2026-11-09', toDate: '2026-11-13', start: '2026-11-09T00:00:00.000Z', end: '2026-11-14T00:00:00.000Z' })
    expect(b.counts).toEqual({ received: 7, answered: 6, firstResponses: 6, closed: 2 })
    expect(b.firstResponse).toEqual({ n: 6, medianHours: 8.25, p90Hours: 18, withinTarget: { n: 6, within: 5, share: 5 / 6 } })
    expect(b.answer).toEqual({ n: 6, medianHours: 13.25, p90Hours: 45.5, withinTarget: { n: 6, within: 5, share: 5 / 6 } })
    expect(b.targetShare.find((s: { priority: string }) => s.priority === 'normal')).toMatchObject({
      firstResponseTargetHours: 17, answerTargetHours: 42.5,
      firstResponse: { n: 6, within: 5 }, answer: { n: 6, within: 5 },
    })
    expect(b.trend).toEqual([{ week: '2026-W46', startDate: '2026-11-09', received: 7, answered: 6, medianAnswerHours: 13.25 }])
    expect(b.topics).toEqual([{ topic: 'thermal', n: 6 }, { topic: 'wind', n: 1 }])
    expect(b.organisations).toEqual([{ id: orgId, name: ORG, n: 7 }])
  })

  it('counts the backlog by status and by working-day age, and lists what is overdue', async () => {
    const { body: b } = await call(`/api/turnaround?${period}&organisation=${orgId}`, { cookie: manager })
    // Open: E (in hand), G (received), I (triaged). E and G arrived in November, far over 10 working days ago; I an hour ago.
    expect(b.backlog.total).toBe(3)
    expect(Object.fromEntries(b.backlog.byStatus.map((s: { status: string, n: number }) => [s.status, s.n])))
      .toEqual({ received: 1, triaged: 1, in_hand: 1, waiting_on_requester: 0, reopened: 0 })
    expect(b.backlog.byAge).toEqual([{ band: '0-2', n: 1 }, { band: '3-5', n: 0 }, { band: '6-10', n: 0 }, { band: '>10', n: 2 }])
    expect(b.backlog.overdue).toBe(2)
    // Longest overdue first: G was due Monday 16 November, E on Wednesday 18 November.
    expect(b.overdue.map((o: { subject: string }) => o.subject)).toEqual(['Turnaround check G', 'Turnaround check E'])
    expect(b.overdue[0]).toMatchObject({ assignee: null, organisation: ORG, dueAt: '2026-11-16T17:30:00.000Z' })
  })

  it('gives the load per officer: open now, answered in the period and the median time to answer', async () => {
    const { body: b } = await call(`/api/turnaround?${period}&organisation=${orgId}`, { cookie: manager })
    const mine = b.officers.find((o: { id: number | null }) => o.id === officerId)
    expect(mine).toMatchObject({ open: 2, answered: 6, medianAnswerHours: 13.25 }) // E and I open; A B C D F H answered
    expect(b.officers.find((o: { id: number | null }) => o.id === null)).toMatchObject({ name: 'Not assigned', open: 1, answered: 0 })
  })

  it('narrows by topic: only C is about wind', async () => {
    const { body: b } = await call(`/api/turnaround?${period}&organisation=${orgId}&topic=wind`, { cookie: manager })
    expect(b.counts).toMatchObject({ received: 1, answered: 1 })
    expect(b.answer).toMatchObject({ n: 1, medianHours: 3, p90Hours: 3 })
  })

  it('measures the pause exactly as the desk\'s clock does (the same working-time module)', () => {
    const clock = serviceClock({
      receivedAt: d('2026-11-10T09:00'), targetWorkingMs: 2550 * 60_000, now: d('2026-11-12T12:00'), stoppedAt: d('2026-11-12T12:00'),
      pauses: [{ from: d('2026-11-10T10:00'), to: d('2026-11-12T10:00') }], calendar: defaultCalendar(),
    })
    expect(clock.elapsedWorkingMs / 3_600_000).toBe(3) // C's answer time in the figures above
  })

  it('keeps the working times it counted on the enquiries, so later figures read them from the index', async () => {
    await call(`/api/turnaround?${period}&organisation=${orgId}`, { cookie: manager })
    const rows = await testDb().query<{ subject: string, first: number | null, answer: number | null }>(
      `SELECT subject, first_response_working_ms AS first, answer_working_ms AS answer FROM enquiries WHERE organisation_id = ? ORDER BY subject`,
      { replacements: [orgId], type: QueryTypes.SELECT },
    )
    const hours = Object.fromEntries(rows.map(r => [r.subject.slice(-1), [r.first === null ? null : Number(r.first) / 3_600_000, r.answer === null ? null : Number(r.answer) / 3_600_000]]))
    // The hand-worked times of the table above; D's first reply was before the week, its answer in it.
    expect(hours).toEqual({ A: [2, 4], B: [4.5, 9.5], C: [0.5, 3], D: [8.5, 45.5], E: [12, null], F: [16.5, 17], G: [null, null], H: [18, 19], I: [null, null] })
  })

  it('has the desk store the times itself when a clock stops, by the rule the figures use', async () => {
    const intake = {
      requester: { name: 'Clock Check', organisation: 'Walk-in Design', email: 'clock@turnaround.example', phone: '+353 1 555 0101' },
      project: { name: 'Clock check house', region: 'Wexford', stage: 'planning', storeys: 2 },
      topic: 'thermal', subject: 'Stored working times check', question: 'A question made up to check the stored working times.', priority: 'normal',
    }
    const { body: made } = await call('/api/enquiries', { body: intake })
    for (const status of ['in_hand', 'waiting_on_requester', 'in_hand', 'answered']) {
      const res = await call(`/api/enquiries/${made.ref}`, { method: 'PATCH', cookie: officer, body: { status } })
      expect(res.status, JSON.stringify(res.body)).toBe(200)
    }
    const db = testDb()
    const [row] = await db.query<{ id: number, received_at: Date, first_response_at: Date, answered_at: Date, first: number, answer: number }>(
      'SELECT id, received_at, first_response_at, answered_at, first_response_working_ms AS first, answer_working_ms AS answer FROM enquiries WHERE ref = ?',
      { replacements: [made.ref], type: QueryTypes.SELECT },
    )
    const events = await db.query<{ from_value: string | null, to_value: string, created_at: Date }>(
      'SELECT from_value, to_value, created_at FROM enquiry_events WHERE enquiry_id = ? AND kind = \'status\'', { replacements: [row!.id], type: QueryTypes.SELECT },
    )
    expect(events.some(e => e.to_value === 'waiting_on_requester')).toBe(true)
    const expected = stoppedClockTimes(
      { receivedAt: new Date(row!.received_at), firstResponseAt: new Date(row!.first_response_at), answeredAt: new Date(row!.answered_at) },
      pausesFromEvents(events.map(e => ({ kind: 'status', fromValue: e.from_value, toValue: e.to_value, createdAt: new Date(e.created_at) }))),
      defaultCalendar(),
    )
    expect({ first: Number(row!.first), answer: Number(row!.answer) }).toEqual({ first: expected.firstResponseWorkingMs, answer: expected.answerWorkingMs })
    // Reopened, the answer clock runs again: its stored time goes until the next answer.
    expect((await call(`/api/enquiries/${made.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'reopened' } })).status).toBe(200)
    const [after] = await db.query<{ answer: number | null, first: number | null }>('SELECT answer_working_ms AS answer, first_response_working_ms AS first FROM enquiries WHERE ref = ?', { replacements: [made.ref], type: QueryTypes.SELECT })
    expect(after).toEqual({ answer: null, first: row!.first })
  })

  it('gives an officer their own figures', async () => {
    const res = await call(`/api/turnaround/mine?${period}&organisation=${orgId}`, { cookie: officer })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ open: 2, overdue: 1, answered: 6, medianAnswerHours: 13.25 })
  })

  it('is for managers: officers get 403, the signed-out 401, bad input 400', async () => {
    expect((await call('/api/turnaround', { cookie: officer })).status).toBe(403)
    expect((await call('/api/turnaround/export.csv', { cookie: officer })).status).toBe(403)
    expect((await call('/api/turnaround')).status).toBe(401)
    expect((await call('/api/turnaround/mine')).status).toBe(401)
    expect((await call('/api/turnaround?period=custom&from=2026-11-13&to=2026-11-09', { cookie: manager })).status).toBe(400)
    expect((await call('/api/turnaround?period=fortnight', { cookie: manager })).status).toBe(400)
  })

  it('exports the rows behind the figures as a CSV attachment', async () => {
    const res = await call(`/api/turnaround/export.csv?${period}&organisation=${orgId}`, { cookie: manager })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="turnaround-2026-11-09-to-2026-11-13.csv"')
    const lines = (res.body as string).trimEnd().split('\r\n')
    expect(lines[0]).toBe('ref,received,first_response,answered,closed,status,topic,priority,officer,organisation,working_hours_to_first_response,working_hours_to_answer,first_response_within_target,answer_within_target')
    // A to H touch the week (D by its answer); I does not.
    expect(lines).toHaveLength(1 + 8)
    const cells = lines.slice(1).map(splitCsvLine)
    // The organisation's name holds a comma, so it comes quoted and still reads back whole.
    expect(lines.find(l => l.includes('2026-11-10 09:00,'))).toContain(`,"${ORG}",`)
    const c = cells.find(r => r[1] === '2026-11-10 09:00')!
    expect(c.slice(1)).toEqual(['2026-11-10 09:00', '2026-11-10 09:30', '2026-11-12 12:00', '', 'answered', 'wind', 'normal', 'Niamh Brennan', ORG, '0.5', '3', 'y', 'y'])
    const late = cells.find(r => r[1] === '2026-11-04 09:00')! // D: first reply 8.5 h, answer 45.5 h — over 42.5
    expect(late.slice(10)).toEqual(['8.5', '45.5', 'y', 'n'])
    const open = cells.find(r => r[1] === '2026-11-13 09:00')! // G: nothing yet
    expect(open.slice(8)).toEqual(['', ORG, '', '', '', ''])
  })
})
