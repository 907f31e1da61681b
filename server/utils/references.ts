import type { Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'

/**
 * Allocates the next TQ-<year>-<seq> reference. The counter row is bumped with LAST_INSERT_ID(expr), which
 * MariaDB keeps per connection, and the row stays locked until the caller's transaction ends — so two
 * concurrent submissions can never read the same number.
 */
export async function allocateReference(transaction: Transaction, at = new Date()): Promise<{ ref: string, year: number, seq: number }> {
  const db = useDb()
  const year = at.getUTCFullYear()
  await db.query(
    'INSERT INTO reference_counters (year, last_seq) VALUES (?, LAST_INSERT_ID(1)) ON DUPLICATE KEY UPDATE last_seq = LAST_INSERT_ID(last_seq + 1)',
    { replacements: [year], type: QueryTypes.INSERT, transaction },
  )
  const [row] = await db.query<{ seq: number }>('SELECT LAST_INSERT_ID() AS seq', { type: QueryTypes.SELECT, transaction })
  const seq = Number(row!.seq)
  return { ref: formatReference(year, seq), year, seq }
}

export function formatReference(year: number, seq: number): string {
  return `TQ-${year}-${String(seq).padStart(4, '0')}`
}
