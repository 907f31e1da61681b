import { turnaroundQuerySchema } from '../../../shared/schemas/turnaround'
import { toCsv } from '../../../shared/turnaround/csv'
import { toHours } from '../../../shared/turnaround/stats'

const header = [
  'ref', 'received', 'first_response', 'answered', 'closed', 'status', 'topic', 'priority', 'officer', 'organisation',
  'working_hours_to_first_response', 'working_hours_to_answer', 'first_response_within_target', 'answer_within_target',
]

/** The rows behind the turnaround figures, as CSV; times are local (Europe/Dublin) `YYYY-MM-DD HH:MM`. */
export default defineEventHandler(async (event) => {
  await requireManager(event)
  const query = await getValidatedQuery(event, parseWith(turnaroundQuerySchema))
  const { period, rows } = await turnaroundExportRows(query)
  const local = new Intl.DateTimeFormat('sv-SE', { timeZone: 'Europe/Dublin', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
  const at = (d: Date | null) => (d ? local.format(d) : '')
  const yn = (b: boolean | null) => (b === null ? '' : b ? 'y' : 'n')
  const csv = toCsv(header, rows.map(r => [
    r.ref, at(r.receivedAt), at(r.firstResponseAt), at(r.answeredAt), at(r.closedAt), r.status, r.topic, r.priority,
    r.officer, r.organisation, toHours(r.firstResponseMs), toHours(r.answerMs), yn(r.firstResponseWithin), yn(r.answerWithin),
  ]))
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="turnaround-${period.fromDate}-to-${period.toDate}.csv"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  return csv
})
