import { fn, col, literal, Op } from 'sequelize'
import type { WhereOptions } from 'sequelize'
import { queueQuerySchema } from '../../../shared/schemas/enquiry'
import type { QueueQuery } from '../../../shared/schemas/enquiry'
import { Enquiry, Organisation, Project, User } from '../../models'

/**
 * The officers' queue: filters, sorting and pages done in SQL on indexed columns, one query for the page
 * (its names joined in, no query per row) and one for the counts per status.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const query = await getValidatedQuery(event, parseWith(queueQuerySchema))
  const db = useDb()

  const where = filters(query, caller.id, db.escape.bind(db))
  const statusWhere = query.status ? { status: { [Op.in]: query.status } } : {}
  const order = {
    'received-desc': [['receivedAt', 'DESC'], ['id', 'DESC']],
    'received-asc': [['receivedAt', 'ASC'], ['id', 'ASC']],
    'due-asc': [[literal('`Enquiry`.`next_due_at` IS NULL'), 'ASC'], ['nextDueAt', 'ASC'], ['id', 'ASC']],
    'priority': [[literal('`Enquiry`.`priority` = \'urgent\''), 'DESC'], ['receivedAt', 'ASC'], ['id', 'ASC']],
  }[query.sort] as never

  // Two queries, not three: the total is the sum of the per-status counts over the chosen statuses.
  const [rows, counts] = await Promise.all([
    Enquiry.findAll({
      where: { [Op.and]: [where, statusWhere] },
      include: [
        { model: User, as: 'assignee', attributes: ['id', 'name'] },
        { model: Organisation, as: 'organisation', attributes: ['name'] },
        { model: Project, as: 'project', attributes: ['name'] },
      ],
      order,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    }),
    sharedRead(countsKey(query, caller.id), () => Enquiry.findAll({
      attributes: ['status', [fn('COUNT', col('id')), 'n']],
      where,
      group: ['status'],
      raw: true,
    }) as unknown as Promise<{ status: string, n: number }[]>),
  ])

  const countsByStatus = Object.fromEntries(counts.map(c => [c.status, Number(c.n)]))
  const total = Object.entries(countsByStatus)
    .filter(([status]) => !query.status || (query.status as string[]).includes(status))
    .reduce((sum, [, n]) => sum + n, 0)
  const now = new Date()
  return {
    enquiries: rows.map(e => queueRow(e, now)),
    total,
    page: query.page,
    pageSize: query.pageSize,
    countsByStatus,
  }
})

/** The filters the status counts depend on: the query without status, order and page; "me" as the caller. */
function countsKey(query: QueueQuery, callerId: number): string {
  const { status: _status, sort: _sort, page: _page, pageSize: _pageSize, ...rest } = query
  return JSON.stringify({ ...rest, assignee: rest.assignee === 'me' ? `user ${callerId}` : rest.assignee })
}

/** Every filter but status (the status counts are taken over the other filters). */
function filters(query: QueueQuery, callerId: number, escape: (v: string) => string): WhereOptions {
  const and: WhereOptions[] = [{ mergedIntoId: null }]
  if (query.topic) and.push({ topic: { [Op.in]: query.topic } })
  if (query.priority) and.push({ priority: query.priority })
  if (query.assignee === 'me') and.push({ assigneeId: callerId })
  else if (query.assignee === 'none') and.push({ assigneeId: null })
  else if (typeof query.assignee === 'number') and.push({ assigneeId: query.assignee })
  if (query.organisation) and.push({ organisationId: query.organisation })
  if (query.overdue) and.push({ nextDueAt: { [Op.lt]: new Date() } })
  if (query.q) {
    const q = query.q.trim()
    if (/^TQ-\d{4}-\d{1,}$/i.test(q)) {
      and.push({ ref: q.toUpperCase() })
    }
    else {
      // Full-text index over subject, question and requester; each word as a prefix, all words required.
      const words = q.split(/\s+/).map(w => w.replace(/[^\p{L}\p{N}]/gu, '')).filter(w => w.length >= 2).slice(0, 8)
      if (words.length) {
        const expr = words.map(w => `+${w}*`).join(' ')
        const match = `MATCH (\`Enquiry\`.\`subject\`, \`Enquiry\`.\`question\`, \`Enquiry\`.\`requester_name\`, \`Enquiry\`.\`requester_organisation\`) AGAINST (${escape(expr)} IN BOOLEAN MODE)`
        and.push(literal(narrowedFirst(query) ? `(${match}) IS TRUE` : match) as unknown as WhereOptions)
      }
    }
  }
  return { [Op.and]: and }
}

/**
 * Whether the other filters pick a set small enough to read first and test the words on, row by row.
 * A bare MATCH in the WHERE clause makes MariaDB read every enquiry the words match (a common word matches
 * one in eight) and only then apply the other filters. Wrapped in an expression (`… IS TRUE`) the MATCH is
 * no longer an access path: MariaDB runs the same one full-text search, reads the rows the indexed filters
 * pick (an officer's own work on one topic, an organisation's), and keeps those the search found — the
 * same rows, as the relevance of a found document is never zero and that of any other always is.
 */
function narrowedFirst(query: QueueQuery): boolean {
  // One topic in ten is a narrow set; more topics soon read more rows than the words match.
  return query.assignee !== undefined || query.organisation !== undefined || (!!query.topic?.length && query.topic.length <= 2)
}
