import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { call, demo, signIn } from '../support/api'
import { closeTestDb } from '../support/db'
import { fillPath, matrix, matrixValues, routeKeys, who } from '../support/routes'
import type { Who } from '../support/routes'
import { useBuiltServer } from '../support/server'

/**
 * Every route file under server/api, called as each kind of caller (the table is in tests/support/routes.ts).
 * Writes are sent with an empty body, so the whole matrix runs without changing any data.
 */
describe('access matrix: every route × every kind of caller', async () => {
  await useBuiltServer()
  const cookies: Partial<Record<Who, string>> = {}
  const values: Record<string, string> = {}

  beforeAll(async () => {
    cookies.specA = await signIn(demo.specA)
    cookies.specB = await signIn(demo.specB)
    cookies.officer = await signIn(demo.officer)
    cookies.manager = await signIn(demo.manager)
    cookies.admin = await signIn(demo.admin)
    Object.assign(values, await matrixValues(cookies.specA))
  })
  afterAll(closeTestDb)

  it('has a row for every route file and no row for a route that is gone', () => {
    const keys = routeKeys()
    expect(Object.keys(matrix).sort()).toEqual(keys)
  })

  const cases = Object.entries(matrix).flatMap(([key, entry]) => who.map(w => ({ key, who: w, entry })))
  it.each(cases)('$key as $who', async ({ key, who: caller, entry }) => {
    const [method] = key.split(' ') as [string]
    const path = fillPath(entry.path, values)
    const res = await call(path, {
      method,
      cookie: cookies[caller],
      body: method === 'GET' ? undefined : {},
    })
    expect(res.status, JSON.stringify(res.body)).toBe(entry.expect[caller])
  })
})
