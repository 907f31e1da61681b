import { QueryTypes } from 'sequelize'
import type { Sequelize, Transaction } from 'sequelize'
import { defaultCalendar } from '../../shared/time/working-time'
import { pausesFromEvents, stoppedClockTimes } from '../../shared/time/stopped-clock'
import type { StatusEvent, StoppedClockTimes } from '../../shared/time/stopped-clock'

/**
 * Works out and stores the stopped-clock working times of enquiries from their own instants and status
 * events: for the migration that adds the columns, and for any row written without them (an import, a
 * hand-made test set) the first time the figures meet it. The desk itself stores them on every change
 * (server/utils/desk-clock.ts), through the same rule and calendar.
 */

const asDate = (v: unknown): Date | null => (v === null || v === undefined ? null : v instanceof Date ? v : new Date(`${String(v).replace(' ', 'T')}Z`))

export async function storeWorkingTimes(sequelize: Sequelize, ids: readonly number[], transaction?: Transaction): Promise<Map<number, StoppedClockTimes>> {
  const out = new Map<number, StoppedClockTimes>()
  if (!ids.length) return out
  const [rows, events] = await Promise.all([
    sequelize.query<{ id: number, received_at: Date, first_response_at: Date | null, answered_at: Date | null }>(
      'SELECT id, received_at, first_response_at, answered_at FROM enquiries WHERE id IN (:ids)',
      { replacements: { ids }, type: QueryTypes.SELECT, transaction },
    ),
    sequelize.query<{ enquiry_id: number, from_value: string | null, to_value: string | null, created_at: Date }>(
      `SELECT enquiry_id, from_value, to_value, created_at FROM enquiry_events
        WHERE enquiry_id IN (:ids) AND kind = 'status' AND (to_value = 'waiting_on_requester' OR from_value = 'waiting_on_requester')`,
      { replacements: { ids }, type: QueryTypes.SELECT, transaction },
    ),
  ])
  const byId = new Map<number, StatusEvent[]>()
  for (const ev of events) {
    const id = Number(ev.enquiry_id)
    const list = byId.get(id) ?? []
    list.push({ kind: 'status', fromValue: ev.from_value, toValue: ev.to_value, createdAt: asDate(ev.created_at)! })
    byId.set(id, list)
  }
  const calendar = defaultCalendar()
  for (const r of rows) {
    const id = Number(r.id)
    out.set(id, stoppedClockTimes(
      { receivedAt: asDate(r.received_at)!, firstResponseAt: asDate(r.first_response_at), answeredAt: asDate(r.answered_at) },
      pausesFromEvents(byId.get(id) ?? []), calendar,
    ))
  }
  if (out.size) {
    // One UPDATE for the lot; every value in the CASE lists is an integer worked out above, never input.
    const when = (pick: (t: StoppedClockTimes) => number | null) => [...out].map(([id, t]) => `WHEN ${id} THEN ${pick(t) ?? 'NULL'}`).join(' ')
    await sequelize.query(
      `UPDATE enquiries SET first_response_working_ms = CASE id ${when(t => t.firstResponseWorkingMs)} END,
        answer_working_ms = CASE id ${when(t => t.answerWorkingMs)} END WHERE id IN (:ids)`,
      { replacements: { ids: [...out.keys()] }, transaction },
    )
  }
  return out
}

/** Every enquiry whose clock has stopped, a batch at a time (the migration's fill). */
export async function storeAllWorkingTimes(sequelize: Sequelize, batch = 2000): Promise<number> {
  let lastId = 0
  let filled = 0
  for (;;) {
    const rows = await sequelize.query<{ id: number }>(
      `SELECT id FROM enquiries WHERE id > :lastId AND (first_response_at IS NOT NULL OR answered_at IS NOT NULL) ORDER BY id LIMIT ${Number(batch)}`,
      { replacements: { lastId }, type: QueryTypes.SELECT },
    )
    if (!rows.length) return filled
    const ids = rows.map(r => Number(r.id))
    await storeWorkingTimes(sequelize, ids)
    filled += ids.length
    lastId = ids.at(-1)!
  }
}
