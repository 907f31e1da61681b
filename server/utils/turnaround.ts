import { QueryTypes } from 'sequelize'
import type { Sequelize } from 'sequelize'
import { workingDayMs, workingMsBetween } from '../../shared/time/working-time'
import type { ServicePriority, ServiceTargetPolicy, WorkingCalendar } from '../../shared/time/working-time'
import type { TurnaroundQuery } from '../../shared/schemas/turnaround'
import { resolvePeriod } from '../../shared/turnaround/period'
import { ageBands, ageBandStarts, toHours } from '../../shared/turnaround/stats'
import type { AgeBand } from '../../shared/turnaround/stats'
import { storeWorkingTimes } from '../database/working-times'
import { deskCalendar, loadServiceTargets } from './desk-clock'

/**
 * The manager's turnaround figures, all worked out in SQL over index ranges. The working time to the first
 * reply and to the answer is stored on the enquiry when each clock stops, by the desk's own clock (the same
 * working-time module, calendar and pause rule: shared/time/stopped-clock.ts), so medians, P90s and target
 * shares are window functions and sums over the stored values rather than a calendar walk per row.
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

const targetOf = (targets: ServiceTargetPolicy, priority: string) => targets[priority as ServicePriority] ?? targets.normal

/** The two stopped clocks: the instant each stops and the working time stored when it did. */
const clocks = {
  firstResponse: { at: 'e.first_response_at', ms: 'e.first_response_working_ms', target: 'firstResponseMs' },
  answer: { at: 'e.answered_at', ms: 'e.answer_working_ms', target: 'answerMs' },
} as const
type ClockName = keyof typeof clocks

/** Enquiries whose clock stopped within the period: one index range, read from the index alone. */
function stoppedIn(clock: ClockName, where: string): string {
  const c = clocks[clock]
  return `FROM enquiries e WHERE ${where} AND ${c.at} >= :start AND ${c.at} < :end AND ${c.ms} IS NOT NULL`
}

/**
 * Rows written without their stored times (an import, a hand-made set) get them the first time the figures
 * meet them, through the same rule the desk uses; afterwards they are read like every other row.
 */
async function fillMissingTimes(db: Sequelize, where: string, replacements: Record<string, unknown>): Promise<void> {
  const missing = await db.query<{ id: number }>(
    (Object.keys(clocks) as ClockName[]).map((k) => {
      const c = clocks[k]
      return `SELECT e.id FROM enquiries e WHERE ${where} AND ${c.at} >= :start AND ${c.at} < :end AND ${c.ms} IS NULL`
    }).join(' UNION '),
    { replacements, type: QueryTypes.SELECT },
  )
  if (missing.length) await storeWorkingTimes(db, missing.map(r => Number(r.id)))
}

const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v))

/**
 * Count, median and nearest-rank P90 of one clock's stored times, over the whole set and per group.
 * MariaDB's PERCENTILE_CONT(0.5) is the median as shared/turnaround/stats.ts defines it (the mean of the
 * two middle values of an even count), and PERCENTILE_DISC(0.9) the first value whose cumulative share
 * reaches 90 % — rank ⌈0.9 n⌉, the nearest-rank P90.
 */
function distributionSql(clock: ClockName, where: string, groupBy?: string): string {
  const ms = clocks[clock].ms
  const over = groupBy ? `OVER (PARTITION BY ${groupBy})` : 'OVER ()'
  return `SELECT DISTINCT ${groupBy ?? 'NULL'} AS g, COUNT(*) ${over} AS n,
      PERCENTILE_CONT(0.5) WITHIN GROUP (ORDER BY ${ms}) ${over} AS median_ms,
      PERCENTILE_DISC(0.9) WITHIN GROUP (ORDER BY ${ms}) ${over} AS p90_ms
    ${stoppedIn(clock, where)}`
}

/** Per priority: how many stopped, and how many within that priority's target (met exactly is met). */
function withinTargetSql(clock: ClockName, where: string): string {
  return `SELECT e.priority AS g, COUNT(*) AS n,
      SUM(${clocks[clock].ms} <= CASE e.priority WHEN 'urgent' THEN :urgentTarget ELSE :normalTarget END) AS within
    ${stoppedIn(clock, where)} GROUP BY e.priority`
}

interface Distribution { g: unknown, n: unknown, median_ms: unknown, p90_ms: unknown }
const summary = (d: Distribution | undefined) => ({ n: Number(d?.n ?? 0), medianHours: toHours(num(d?.median_ms)), p90Hours: toHours(num(d?.p90_ms)) })

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

  const targets = await loadServiceTargets()
  const timedSpan = { ...span, ...weekBounds, normalTarget: 0, urgentTarget: 0 }
  const targetSpan = (key: 'firstResponseMs' | 'answerMs') => ({ ...timedSpan, normalTarget: targets.normal[key], urgentTarget: targets.urgent[key] })
  await fillMissingTimes(db, f.sql, span)
  const answerWeekCase = `CASE ${period.weeks.map((_, i) => `WHEN e.answered_at < :w${i} THEN ${i}`).join(' ')} END`

  const [received, [closed], backlog, overdue, openByOfficer, firstAll, answerAll, answerByOfficer, answerByWeek, firstWithin, answerWithin] = await Promise.all([
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
    select<Distribution>(distributionSql('firstResponse', f.sql), timedSpan),
    select<Distribution>(distributionSql('answer', f.sql), timedSpan),
    select<Distribution>(distributionSql('answer', f.sql, 'e.assignee_id'), timedSpan),
    select<Distribution>(distributionSql('answer', f.sql, answerWeekCase), timedSpan),
    select<{ g: string, n: number, within: number }>(withinTargetSql('firstResponse', f.sql), targetSpan('firstResponseMs')),
    select<{ g: string, n: number, within: number }>(withinTargetSql('answer', f.sql), targetSpan('answerMs')),
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

  const perOfficer = new Map(answerByOfficer.map(d => [num(d.g), d]))
  const perWeek = new Map(answerByWeek.map(d => [Number(d.g), d]))
  const share = (rows: { g: string, n: number, within: number }[], priority: string) => {
    const r = rows.find(x => x.g === priority)
    const n = Number(r?.n ?? 0)
    const within = Number(r?.within ?? 0)
    return { n, within, share: n ? within / n : null }
  }
  const priorityNames = [...new Set(['normal', 'urgent', ...firstWithin.map(r => r.g), ...answerWithin.map(r => r.g)])]
    .filter(p => !query.priority || p === query.priority)
  const targetShare = priorityNames.map((priority) => {
    const t = targetOf(targets, priority)
    return {
      priority,
      firstResponseTargetHours: toHours(t.firstResponseMs),
      answerTargetHours: toHours(t.answerMs),
      firstResponse: share(firstWithin, priority),
      answer: share(answerWithin, priority),
    }
  })
  const all = (key: 'firstResponse' | 'answer') => {
    const n = targetShare.reduce((a, s) => a + s[key].n, 0)
    const within = targetShare.reduce((a, s) => a + s[key].within, 0)
    return { n, within, share: n ? within / n : null }
  }
  const firstResponse = summary(firstAll[0])
  const answer = summary(answerAll[0])

  // Officers: everyone on staff, and anyone else who holds work in these figures.
  const officerIds = new Set<number>([...openByOfficer.map(o => num(o.assignee_id)), ...perOfficer.keys()].filter((x): x is number => x !== null))
  const orgIds = topOrgs.map(([id]) => id).filter((x): x is number => x !== null)
  const [staff, orgNames] = await Promise.all([select<{ id: number, name: string, role: string }>(
    `SELECT id, name, role FROM users WHERE (role IN ('officer', 'manager', 'admin') AND deactivated_at IS NULL)${officerIds.size ? ' OR id IN (:ids)' : ''} ORDER BY name`,
    { ids: [...officerIds] },
  ), orgIds.length ? select<{ id: number, name: string }>('SELECT id, name FROM organisations WHERE id IN (:orgIds)', { orgIds }) : Promise.resolve([])])
  const officers = [
    ...staff.filter(s => !query.officer || s.id === query.officer).map(s => ({ id: s.id as number | null, name: s.name })),
    { id: null, name: 'Not assigned' },
  ].map((s) => {
    const times = summary(perOfficer.get(s.id))
    return { ...s, open: Number(openByOfficer.find(o => o.assignee_id === s.id)?.n ?? 0), answered: times.n, medianAnswerHours: times.medianHours }
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
      answered: answer.n,
      firstResponses: firstResponse.n,
      closed: Number(closed?.n ?? 0),
    },
    firstResponse: { ...firstResponse, withinTarget: all('firstResponse') },
    answer: { ...answer, withinTarget: all('answer') },
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
      const times = summary(perWeek.get(i))
      return {
        week: w.week,
        startDate: w.startDate,
        received: receivedByWeek.get(i) ?? 0,
        answered: times.n,
        medianAnswerHours: times.medianHours,
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
  await fillMissingTimes(db, f.sql, span)
  const [[open], [answered]] = await Promise.all([
    db.query<{ n: number, overdue: number }>(`SELECT COUNT(*) AS n, SUM(e.next_due_at < :now) AS overdue FROM enquiries e WHERE ${f.sql} AND e.status IN (:open)`,
      { replacements: { ...span, now }, type: QueryTypes.SELECT }),
    db.query<Distribution>(distributionSql('answer', f.sql), { replacements: span, type: QueryTypes.SELECT }),
  ])
  const times = summary(answered)
  return {
    period: { kind: period.kind, fromDate: period.fromDate, toDate: period.toDate },
    open: Number(open?.n ?? 0),
    overdue: Number(open?.overdue ?? 0),
    answered: times.n,
    medianAnswerHours: times.medianHours,
  }
}

/** The rows behind the figures, for the CSV export: everything received, replied to, answered or closed in the period. */
export async function turnaroundExportRows(query: TurnaroundQuery, now = new Date()) {
  const db = useDb()
  const cal = deskCalendar()
  const period = resolvePeriod(query, now, cal.timeZone)
  const f = filterSql(query)
  const span = { ...f.replacements, start: period.start, end: period.end }
  const cols = `e.id, e.ref, e.status, e.topic, e.priority, e.assignee_id, e.organisation_id, e.received_at, e.first_response_at, e.answered_at, e.closed_at,
    e.first_response_working_ms, e.answer_working_ms`
  const ids = ['received_at', 'first_response_at', 'answered_at', 'closed_at']
    .map(c => `SELECT e.id FROM enquiries e WHERE ${f.sql} AND e.${c} >= :start AND e.${c} < :end`).join(' UNION ')
  const [targets, rows] = await Promise.all([
    loadServiceTargets(),
    db.query<Record<string, unknown>>(`SELECT ${cols}, u.name AS officer, COALESCE(o.name, e.requester_organisation) AS organisation_name
      FROM (${ids}) AS picked JOIN enquiries e ON e.id = picked.id
      LEFT JOIN users u ON u.id = e.assignee_id LEFT JOIN organisations o ON o.id = e.organisation_id
      ORDER BY e.received_at, e.id`, { replacements: span, type: QueryTypes.SELECT }),
  ])
  // A row received or closed in the period may have stopped its clocks outside it, unfilled as yet.
  const unfilled = rows.filter(r => (r.first_response_at !== null && r.first_response_working_ms === null) || (r.answered_at !== null && r.answer_working_ms === null))
  const filled = await storeWorkingTimes(db, unfilled.map(r => Number(r.id)))
  return {
    period,
    rows: rows.map((r) => {
      const id = Number(r.id)
      const priority = String(r.priority)
      const t = targetOf(targets, priority)
      const firstResponseMs = filled.get(id)?.firstResponseWorkingMs ?? num(r.first_response_working_ms)
      const answerMs = filled.get(id)?.answerWorkingMs ?? num(r.answer_working_ms)
      return {
        id,
        ref: String(r.ref),
        status: String(r.status),
        topic: String(r.topic),
        priority,
        receivedAt: asDate(r.received_at)!,
        firstResponseAt: asDate(r.first_response_at),
        answeredAt: asDate(r.answered_at),
        closedAt: asDate(r.closed_at),
        officer: (r.officer as string | null) ?? null,
        organisation: (r.organisation_name as string | null) ?? null,
        firstResponseMs,
        answerMs,
        firstResponseWithin: firstResponseMs === null ? null : firstResponseMs <= t.firstResponseMs,
        answerWithin: answerMs === null ? null : answerMs <= t.answerMs,
      }
    }),
  }
}
