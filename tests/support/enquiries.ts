import { QueryTypes } from 'sequelize'
import { expect } from 'vitest'
import { call } from './api'
import { testDb } from './db'

/** A new enquiry sent by a signed-in specifier and taken in hand by an officer; its reference and row id. */
export async function enquiryInHand(cookies: { specifier: string, officer: string }, intake: object): Promise<{ ref: string, id: number }> {
  const created = await call('/api/enquiries', { body: intake, cookie: cookies.specifier })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const ref = created.body.ref as string
  expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: cookies.officer, body: { status: 'in_hand' } })).status).toBe(200)
  const [row] = await testDb().query<{ id: number }>('SELECT id FROM enquiries WHERE ref = ?', { replacements: [ref], type: QueryTypes.SELECT })
  return { ref, id: row!.id }
}
