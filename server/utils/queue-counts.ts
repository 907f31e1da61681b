import type { Transaction } from 'sequelize'
import { Enquiry } from '../models'

/**
 * The queue's counts per status scan every live enquiry matching the filters (about 30 ms over 100,000), and
 * every officer's queue asks for them on every page. Identical counts asked for while one is already being
 * read share that read (single flight) instead of each running its own: under 50 connections that turned
 * pool time-outs into answers. Nothing is kept once the read is done, and a write to an enquiry in this
 * process, once committed, stops later requests joining a read begun before it, so one's own change always
 * shows; a change made on another instance shows as soon as that read ends, as if the request had come a
 * few milliseconds earlier.
 */

const inFlight = new Map<string, { generation: number, read: Promise<unknown> }>()
let generation = 0
let watching = false

function watchEnquiryWrites() {
  if (watching) return
  watching = true
  const changed = (_: unknown, options?: { transaction?: Transaction | null }) => {
    generation++
    options?.transaction?.afterCommit(() => { generation++ })
  }
  for (const hook of ['afterCreate', 'afterUpdate', 'afterSave', 'afterDestroy', 'afterBulkCreate', 'afterBulkUpdate', 'afterBulkDestroy', 'afterUpsert'] as const) {
    Enquiry.addHook(hook as 'afterSave', `queue-counts-${hook}`, changed as never)
  }
}

export function sharedRead<T>(key: string, read: () => Promise<T>): Promise<T> {
  watchEnquiryWrites()
  const current = inFlight.get(key)
  if (current && current.generation === generation) return current.read as Promise<T>
  const entry = { generation, read: read().finally(() => { if (inFlight.get(key) === entry) inFlight.delete(key) }) }
  inFlight.set(key, entry)
  return entry.read
}
