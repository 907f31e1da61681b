import { QueryTypes } from 'sequelize'
import type { Sequelize } from 'sequelize'
import { workingDayMs, workingMsBetween } from '../../shared/time/working-time'
import type { Pause, ServicePriority, ServiceTargetPolicy, WorkingCalendar } from '../../shared/time/working-time'
import type { TurnaroundQuery } from '../../shared/schemas/turnaround'
import { resolvePeriod } from '../../shared/turnaround/period'
import type { ResolvedPeriod } from '../../shared/turnaround/period'
import { ageBands, ageBandStarts, median, percentile, shareWithin, toHours } from '../../shared/turnaround/stats'
import type { AgeBand } from '../../shared/turnaround/stats'
import { deskCalendar, loadServiceTargets, pausesFromEvents } from './desk-clock'

/**
 * The manager's turnaround figures. Counting and grouping happen in SQL on indexed columns; only the
 * enquiries first answered or replied to within the period are fetched, with their waiting-on-requester
 * events in one further query, because their working time needs the desk's own calendar and pauses
 * (the same module and the same pause rule as the desk's clock, so the figures agree with it).
 */

const openStatuses = ['received', 'triaged', 'in_hand', 'waiting_on_requester', 'reopened'] as const

type Filters = Pick<TurnaroundQuery, 'topic' | 'officer' | 'organisation' | 'priority'>

/** The WHERE fragment every figure shares, with its named replacements. */
function filterSql(q: Filters): { sql: string, replacements: Record<string, unknown> } {
  const parts = ['e.merged_into_id IS NULL']
  const replacements: Record<string, unknown> = {}
  if (q.topic) { parts.push('e.topic = :topic'); replacements.topic = q.topic }
  if (q.priority) { parts.push('e.priority = :priority'); replacements.priority = q.priority }
  if (q.officer) { parts.push('e.assignee_id = :officer'); replacements.officer = q.officer }
  if (q.organisation) { parts.push('e.organisation_id = :organisation'); replacements.organisation = q.organisation }
  return { sql: parts.join(' AND '), replacements }
}

const asDate = (v: unknown): Date | null => (v === null || v === undefined ? null : v instanceof Date ? v : new Date(`${String(v).replace(' ', 'T')}Z`))

interface TimedRow {
  id: number
  ref: string
  priority: string
  assigneeId: number | null
  receivedAt: Date
  firstResponseAt: Date | null
  answeredAt: Date | null
  /** Working ms from receipt to the first reply, pauses excluded; null without a reply. */
  firstResponseMs: number | null
  /** Working ms from receipt to the answer, pauses excluded; null while unanswered. */
  answerMs: number | null
}

/**
 * One query for the waiting-on-requester transitions of many enquiries, grouped into pauses per enquiry.
 * The enquiries are named by the same SQL that picks the rows (`idsSql` selects their `id`), so this runs
 * beside the row query rather than after it.
 */
async function pausesFor(db: Sequelize, idsSql: string, replacements: Record<string, unknown>): Promise<Map<number, Pause[]>> {
  const byId = new Map<number, { kind: string, fromValue: string | null, toValue: string | null, createdAt: Date }[]>()
  const events = await db.query<{ enquiry_id: number, from_value: string | null, to_value: string | null, created_at: Date }>(
    // A join on the derived id list: MariaDB runs `IN (… UNION …)` as a dependent subquery per event row.
    `SELECT ev.enquiry_id, ev.from_value, ev.to_value, ev.created_at FROM enquiry_events ev
      JOIN (${idsSql}) AS picked ON picked.id = ev.enquiry_id
      WHERE ev.kind = 'status' AND (ev.to_value = 'waiting_on_requester' OR ev.from_value = 'waiting_on_requester')`,
    { replacements, type: QueryTypes.SELECT },
  )
  for (const ev of events) {
    let list = byId.get(ev.enquiry_id)
    if (!list) byId.set(ev.enquiry_id, list = [])
    list.push({ kind: 'status', fromValue: ev.from_value, toValue: ev.to_value, createdAt: asDate(ev.created_at)! })
  }
  return new Map([...byId].map(([id, list]) => [id, pausesFromEvents(list)]))
}

/**
 * Working times already worked out, keyed by everything they depend on (the enquiry's instants and its
 * pauses; the calendar is fixed for the life of the process). An answered enquiry's times never change
 * unless one of those inputs does, which changes the key — so the Monday view does not redo the same
 * calendar walk for thousands of rows on every request. Bounded: cleared when it grows past its size.
 */
const workingTimeMemo = new Map<string, { first: number | null, answer: number | null }>()
const MEMO_LIMIT = 250_000

function workingTimes(id: number, receivedAt: Date, firstResponseAt: Date | null, answeredAt: Date | null, pauses: Pause[], cal: WorkingCalendar) {
  const key = `${id}|${receivedAt.getTime()}|${firstResponseAt?.getTime() ?? ''}|${answeredAt?.getTime() ?? ''}|${pauses.map(p => `${p.from.getTime()}-${p.to?.getTime() ?? ''}`).join(',')}`
  let hit = workingTimeMemo.get(key)
  if (!hit) {
    hit = {
      first: firstResponseAt ? workingMsBetween(receivedAt, firstResponseAt, cal, pauses) : null,
      answer: answeredAt ? workingMsBetween(receivedAt, answeredAt, cal, pauses) : null,
    }
    if (workingTimeMemo.size >= MEMO_LIMIT) workingTimeMemo.clear()
    workingTimeMemo.set(key, hit)
  }
  return hit
}

/** Rows with their working times, in one pass once the pauses are in. */
async function timedRows(db: Sequelize, rowsSql: string, idsSql: string, replacements: Record<string, unknown>, cal: WorkingCalendar): Promise<(TimedRow & Record<string, unknown>)[]> {
  const [rows, pauses] = await Promise.all([
    db.query<Record<string, unknown>>(rowsSql, { replacements, type: QueryTypes.SELECT }),
    pausesFor(db, idsSql, replacements),
  ])
  return rows.map((r) => {
    const id = Number(r.id)
    const receivedAt = asDate(r.received_at)!
    const firstResponseAt = asDate(r.first_response_at)
    const answeredAt = asDate(r.answered_at)
    const times = workingTimes(id, receivedAt, firstResponseAt, answeredAt, pauses.get(id) ?? [], cal)
    return {
      ...r,
      id,
      ref: r.ref === undefined ? '' : String(r.ref),
      priority: String(r.priority),
      assigneeId: r.assignee_id === null ? null : Number(r.assignee_id),
      receivedAt,
      firstResponseAt,
      answeredAt,
      firstResponseMs: times.first,
      answerMs: times.answer,
    }
  })
}

/**
 * Enquiries first replied to or answered in the period: two index ranges, not one OR that scans the table.
 * The second leaves out what the first found, so the halves need no de-duplicating (UNION ALL).
 */
function repliedOrAnswered(where: string, cols: string): string {
  return `SELECT ${cols} FROM enquiries e WHERE ${where} AND e.answered_at >= :start AND e.answered_at < :end
    UNION ALL
    SELECT ${cols} FROM enquiries e WHERE ${where} AND e.first_response_at >= :start AND e.first_response_at < :end
      AND (e.answered_at IS NULL OR e.answered_at < :start OR e.answered_at >= :end)`
}

const targetOf = (targets: ServiceTargetPolicy, priority: string) => targets[priority as ServicePriority] ?? targets.normal
const inSpan = (d: Date | null, period: ResolvedPeriod) => !!d && d >= period.start && d < period.end

function summary(values: number[]) {
  return { n: values.length, medianHours: toHours(median(values)), p90Hours: toHours(percentile(values, 90)) }
}

/**
 * The latest instant t at which an enquiry received then is `days` working days old now: an enquiry
 * received at or before t is at least that old. Found by halving, since age only grows as t moves back.
 */
const cutoffMemo = new Map<string, Date>()
function ageCutoff(now: Date, days: number, cal: WorkingCalendar): Date {
  // Ages are counted to the second; the same cut-off serves every request within one second.
  const key = `${Math.floor(now.getTime() / 1000)}|${days}`
  const known = cutoffMemo.get(key)
  if (known) return known
  if (cutoffMemo.size > 32) cutoffMemo.clear()
  const need = days * workingDayMs(cal)
  let lo = now.getTime() - (days * 3 + 40) * 86_400_000 // certainly old enough, even over Christmas
  let hi = now.getTime()
  while (hi - lo > 1000) {
    const mid = Math.floor((lo + hi) / 2)
    if (workingMsBetween(new Date(mid), now, cal) >= need) lo = mid
    else hi = mid
  }
  cutoffMemo.set(key, new Date(lo))
  return new Date(lo)
}

export async function turnaroundFigures(query: TurnaroundQuery, now = new Date()) {
  const db = useDb()
  const cal = deskCalendar()
  const period = resolvePeriod(query, now, cal.timeZone)
  const f = filterSql(query)
  const span = { ...f.replacements, start: period.start, end: period.end, now, open: openStatuses }
  const cut = Object.fromEntries(ageBands.slice(1).map(b => [b, ageCutoff(now, ageBandStarts[b], cal)])) as Record<Exclude<AgeBand, '0-2'>, Date>
  const weekCase = `CASE ${period.weeks.map((_, i) => `WHEN e.received_at < :w${i} THEN ${i}`).join(' ')} END`
  const weekBounds = Object.fromEntries(period.weeks.map((w, i) => [`w${i}`, w.end]))
  const select = <T extends object>(sql: string, replacements: Record<string, unknown> = span) => db.query<T>(sql, { replacements, type: QueryTypes.SELECT })

  const [targets, received, [closed], backlog, overdue, openByOfficer, timed] = await Promise.all([
    loadServiceTargets(),
    // Received in the period: one index range, grouped at once by week, topic and organisation.
    select<{ w: number, topic: string, organisation_id: number | null, n: number }>(`SELECT ${weekCase} AS w, e.topic, e.organisation_id, COUNT(*) AS n
      FROM enquiries e WHERE ${f.sql} AND e.received_at >= :start AND e.received_at < :end GROUP BY w, e.topic, e.organisation_id`, { ...span, ...weekBounds }),
    select<{ n: number }>(`SELECT COUNT(*) AS n FROM enquiries e WHERE ${f.sql} AND e.closed_at >= :start AND e.closed_at < :end`),
    select<{ status: string, n: number, overdue: number, b1: number, b2: number, b3: number }>(`SELECT e.status, COUNT(*) AS n,
        SUM(e.next_due_at < :now) AS overdue,
        SUM(e.received_at <= :c1 AND e.received_at > :c2) AS b1,
        SUM(e.received_at <= :c2 AND e.received_at > :c3) AS b2,
        SUM(e.received_at <= :c3) AS b3
      FROM enquiries e WHERE ${f.sql} AND e.status IN (:open) GROUP BY e.status`, { ...span, c1: cut['3-5'], c2: cut['6-10'], c3: cut['>10'] }),
    select<{ ref: string, subject: string, status: string, priority: string, next_due_at: Date, assignee: string | null, organisation: string | null }>(
      `SELECT e.ref, e.subject, e.status, e.priority, e.next_due_at, u.name AS assignee, COALESCE(o.name, e.requester_organisation) AS organisation
      FROM enquiries e LEFT JOIN users u ON u.id = e.assignee_id LEFT JOIN organisations o ON o.id = e.organisation_id
      WHERE ${f.sql} AND e.status IN (:open) AND e.next_due_at < :now ORDER BY e.next_due_at, e.id LIMIT 50`),
    select<{ assignee_id: number | null, n: number }>(`SELECT e.assignee_id, COUNT(*) AS n FROM enquiries e
      WHERE ${f.sql} AND e.status IN (:open) GROUP BY e.assignee_id`),
    timedRows(db, repliedOrAnswered(f.sql, 'e.id, e.priority, e.assignee_id, e.received_at, e.first_response_at, e.answered_at'), repliedOrAnswered(f.sql, 'e.id'), span, cal),
  ])

  const receivedByWeek = new Map<number, number>()
  const topicCounts = new Map<string, number>()
  const orgCounts = new Map<number | null, number>()
  for (const r of received) {
    const n = Number(r.n)
    receivedByWeek.set(Number(r.w), (receivedByWeek.get(Number(r.w)) ?? 0) + n)
    topicCounts.set(r.topic, (topicCounts.get(r.topic) ?? 0) + n)
    orgCounts.set(r.organisation_id, (orgCounts.get(r.organisation_id) ?? 0) + n)
  }
  const topOrgs = [...orgCounts].sort((a, b) => b[1] - a[1]).slice(0, 10)

  // One pass over the timed rows: every list and tally the figures need.
  const firstResponse: number[] = []
  const answer: number[] = []
  const perPriority = new Map<string, { first: number[], answer: number[] }>()
  const perOfficer = new Map<number | null, number[]>()
  const perWeek = new Map<string, number[]>()
  for (const r of timed) {
    const slot = perPriority.get(r.priority) ?? { first: [], answer: [] }
    perPriority.set(r.priority, slot)
    if (inSpan(r.firstResponseAt, period) && r.firstResponseMs !== null) {
      firstResponse.push(r.firstResponseMs)
      slot.first.push(r.firstResponseMs)
    }
    if (inSpan(r.answeredAt, period) && r.answerMs !== null) {
      answer.push(r.answerMs)
      slot.answer.push(r.answerMs)
      const o = perOfficer.get(r.assigneeId) ?? []
      o.push(r.answerMs)
      perOfficer.set(r.assigneeId, o)
      // The week from its bounds as instants: no time-zone formatting per row.
      const at = r.answeredAt!.getTime()
      const week = period.weeks.find(w => at < w.end.getTime())!.week
      const w = perWeek.get(week) ?? []
      w.push(r.answerMs)
      perWeek.set(week, w)
    }
  }

  const priorityNames = [...new Set(['normal', 'urgent', ...perPriority.keys()])].filter(p => !query.priority || p === query.priority)
  const targetShare = priorityNames.map((priority) => {
    const t = targetOf(targets, priority)
    const slot = perPriority.get(priority) ?? { first: [], answer: [] }
    return {
      priority,
      firstResponseTargetHours: toHours(t.firstResponseMs),
      answerTargetHours: toHours(t.answerMs),
      firstResponse: shareWithin(slot.first, t.firstResponseMs),
      answer: shareWithin(slot.answer, t.answerMs),
    }
  })
  const all = (key: 'firstResponse' | 'answer') => {
    const n = targetShare.reduce((a, s) => a + s[key].n, 0)
    const within = targetShare.reduce((a, s) => a + s[key].within, 0)
    return { n, within, share: n ? within / n : null }
  }

  // Officers: everyone on staff, and anyone else who holds work in these figures.
  const officerIds = new Set<number>([...openByOfficer.map(o => o.assignee_id), ...perOfficer.keys()].filter((x): x is number => x !== null))
  const orgIds = topOrgs.map(([id]) => id).filter((x): x is number => x !== null)
  const [staff, orgNames] = await Promise.all([select<{ id: number, name: string, role: string }>(
    `SELECT id, name, role FROM users WHERE (role IN ('officer', 'manager', 'admin') AND deactivated_at IS NULL)${officerIds.size ? ' OR id IN (:ids)' : ''} ORDER BY name`,
    { ids: [...officerIds] },
  ), orgIds.length ? select<{ id: number, name: string }>('SELECT id, name FROM organisations WHERE id IN (:orgIds)', { orgIds }) : Promise.resolve([])])
  const officers = [
    ...staff.filter(s => !query.officer || s.id === query.officer).map(s => ({ id: s.id as number | null, name: s.name })),
    { id: null, name: 'Not assigned' },
  ].map((s) => {
    const times = perOfficer.get(s.id) ?? []
    return { ...s, open: Number(openByOfficer.find(o => o.assignee_id === s.id)?.n ?? 0), answered: times.length, medianAnswerHours: toHours(median(times)) }
  }).filter(o => o.id !== null ? (o.open || o.answered || staff.find(s => s.id === o.id)?.role === 'officer') : o.open || o.answered)

  const statusCounts = Object.fromEntries(openStatuses.map(s => [s, 0])) as Record<typeof openStatuses[number], number>
  const bandCounts: Record<AgeBand, number> = { '0-2': 0, '3-5': 0, '6-10': 0, '>10': 0 }
  let overdueTotal = 0
  for (const b of backlog) {
    const n = Number(b.n)
    statusCounts[b.status as typeof openStatuses[number]] = n
    const [b1, b2, b3] = [Number(b.b1 ?? 0), Number(b.b2 ?? 0), Number(b.b3 ?? 0)]
    bandCounts['3-5'] += b1
    bandCounts['6-10'] += b2
    bandCounts['>10'] += b3
    bandCounts['0-2'] += n - b1 - b2 - b3
    overdueTotal += Number(b.overdue ?? 0)
  }

  return {
    period: { kind: period.kind, fromDate: period.fromDate, toDate: period.toDate, start: period.start.toISOString(), end: period.end.toISOString(), timeZone: cal.timeZone },
    filters: { topic: query.topic ?? null, officer: query.officer ?? null, organisation: query.organisation ?? null, priority: query.priority ?? null },
    counts: {
      received: [...receivedByWeek.values()].reduce((a, n) => a + n, 0),
      answered: answer.length,
      firstResponses: firstResponse.length,
      closed: Number(closed?.n ?? 0),
    },
    firstResponse: { ...summary(firstResponse), withinTarget: all('firstResponse') },
    answer: { ...summary(answer), withinTarget: all('answer') },
    targetShare,
    backlog: {
      total: Object.values(statusCounts).reduce((a, b) => a + b, 0),
      overdue: overdueTotal,
      byStatus: openStatuses.map(status => ({ status, n: statusCounts[status] })),
      byAge: ageBands.map(band => ({ band, n: bandCounts[band] })),
    },
    overdue: overdue.map(o => ({
      ref: o.ref,
      subject: o.subject,
      status: o.status,
      priority: o.priority,
      dueAt: asDate(o.next_due_at)!.toISOString(),
      overdueHours: toHours(workingMsBetween(asDate(o.next_due_at)!, now, cal)),
      assignee: o.assignee,
      organisation: o.organisation,
    })),
    officers,
    topics: [...topicCounts].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([topic, n]) => ({ topic, n })),
    organisations: topOrgs.map(([id, n]) => ({ id, name: id === null ? 'No organisation (public requesters)' : orgNames.find(o => o.id === id)?.name ?? `Organisation ${id}`, n })),
    trend: period.weeks.map((w, i) => {
      const times = perWeek.get(w.week) ?? []
      return {
        week: w.week,
        startDate: w.startDate,
        received: receivedByWeek.get(i) ?? 0,
        answered: times.length,
        medianAnswerHours: toHours(median(times)),
      }
    }),
    generatedAt: now.toISOString(),
  }
}

/** An officer's own figures for the desk: open work, answers given in the period, their median time to answer. */
export async function officerOwnFigures(officerId: number, query: TurnaroundQuery, now = new Date()) {
  const db = useDb()
  const cal = deskCalendar()
  const period = resolvePeriod(query, now, cal.timeZone)
  const f = filterSql({ ...query, officer: officerId })
  const span = { ...f.replacements, start: period.start, end: period.end, open: openStatuses }
  const [[open], answered] = await Promise.all([
    db.query<{ n: number, overdue: number }>(`SELECT COUNT(*) AS n, SUM(e.next_due_at < :now) AS overdue FROM enquiries e WHERE ${f.sql} AND e.status IN (:open)`,
      { replacements: { ...span, now }, type: QueryTypes.SELECT }),
    timedRows(db, `SELECT e.id, e.priority, e.assignee_id, e.received_at, e.first_response_at, e.answered_at FROM enquiries e
      WHERE ${f.sql} AND e.answered_at >= :start AND e.answered_at < :end`,
    `SELECT e.id FROM enquiries e WHERE ${f.sql} AND e.answered_at >= :start AND e.answered_at < :end`, span, cal),
  ])
  const times = answered.map(r => r.answerMs!).filter(ms => ms !== null)
  return {
    period: { kind: period.kind, fromDate: period.fromDate, toDate: period.toDate },
    open: Number(open?.n ?? 0),
    overdue: Number(open?.overdue ?? 0),
    answered: times.length,
    medianAnswerHours: toHours(median(times)),
  }
}

/** The rows behind the figures, for the CSV export: everything received, replied to, answered or closed in the period. */
export async function turnaroundExportRows(query: TurnaroundQuery, now = new Date()) {
  const db = useDb()
  const cal = deskCalendar()
  const period = resolvePeriod(query, now, cal.timeZone)
  const f = filterSql(query)
  const span = { ...f.replacements, start: period.start, end: period.end }
  const cols = `e.id, e.ref, e.status, e.topic, e.priority, e.assignee_id, e.organisation_id, e.received_at, e.first_response_at, e.answered_at, e.closed_at`
  const ids = ['received_at', 'first_response_at', 'answered_at', 'closed_at']
    .map(c => `SELECT e.id FROM enquiries e WHERE ${f.sql} AND e.${c} >= :start AND e.${c} < :end`).join(' UNION ')
  const [targets, rows] = await Promise.all([
    loadServiceTargets(),
    timedRows(db, `SELECT ${cols}, u.name AS officer, COALESCE(o.name, e.requester_organisation) AS organisation_name
      FROM (${ids}) AS picked JOIN enquiries e ON e.id = picked.id
      LEFT JOIN users u ON u.id = e.assignee_id LEFT JOIN organisations o ON o.id = e.organisation_id
      ORDER BY e.received_at, e.id`, ids, span, cal),
  ])
  return {
    period,
    rows: rows.map((r) => {
      const t = targetOf(targets, r.priority)
      return {
        ...r,
        status: String(r.status),
        topic: String(r.topic),
        closedAt: asDate(r.closed_at),
        officer: (r.officer as string | null) ?? null,
        organisation: (r.organisation_name as string | null) ?? null,
        firstResponseWithin: r.firstResponseMs === null ? null : r.firstResponseMs <= t.firstResponseMs,
        answerWithin: r.answerMs === null ? null : r.answerMs <= t.answerMs,
      }
    }),
  }
}
