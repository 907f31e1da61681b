import { existsSync } from 'node:fs'
import { Readable } from 'node:stream'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { jsonBodyMaxBytes } from '../../server/utils/request-limits'
import { uploadLimits } from '../../shared/types/enquiry'
import { call, callForm, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { fakeExe, makePdf, tinyPng } from '../support/files'
import { fillPath, matrix, matrixValues } from '../support/routes'
import type { Who } from '../support/routes'
import { databaseState, deepArrays, deepObjects, expectNoLeak, reachingCaller, uploadEntries } from '../support/security'
import { useBuiltServer } from '../support/server'

/**
 * A table of hostile inputs sent to every route file, each time as the least-privileged caller who gets past
 * the route's access check (from the access matrix). Every answer is a 4xx without a stack trace or SQL in it,
 * and nothing is written: no row changes in any table, no file appears in the upload store.
 */

// Every field name the routes' schemas read, so the hostile bodies reach each one.
const fieldNames = [
  'email', 'password', 'name', 'phone', 'organisationName', 'organisationKind', 'token', 'role', 'active', 'intoId',
  'intoRef', 'status', 'priority', 'assigneeId', 'topic', 'subject', 'question', 'project', 'requester', 'body', 'method',
  'inputs', 'replyBody', 'items', 'calculationIds', 'checkerId', 'scope', 'quantities', 'discountPercent', 'vatPercent',
  'validUntil', 'deliveryCode', 'unitPriceCents', 'packSize', 'description', 'targets', 'successor', 'text', 'limit',
  'layers', 'tempC', 'rhPercent', 'action', 'enquiryRef', 'kind', 'internal',
]
// Free-text fields are left out of the SQL case: text with quotes in it is valid there (and stored verbatim,
// checked below); the case is about identifiers, numbers and choices that reach a WHERE clause.
const sqlValues = {
  email: `' OR '1'='1' --`,
  password: `' OR 1=1; --`,
  token: `x' UNION SELECT password_hash FROM users --`,
  intoRef: `TQ-2026-0001' OR '1'='1`,
  intoId: '1 OR 1=1',
  checkerId: '0; DROP TABLE users',
  assigneeId: '1) OR (1=1',
  status: `closed'; DROP TABLE enquiries; --`,
  priority: `urgent' --`,
  role: `admin' --`,
  method: `u-value'; DELETE FROM calculations; --`,
  successor: `D-WIN-01' UNION SELECT 1 --`,
  items: [`D-WIN-01' OR 1=1 --`],
  calculationIds: ['1 OR 1=1'],
  unitPriceCents: '1; UPDATE price_items SET unit_price_cents = 0',
  targets: `'; TRUNCATE service_targets; --`,
  limit: '1 UNION SELECT',
}

interface Hostile {
  label: string
  body: () => string | Buffer | FormData | ReadableStream
  type?: string
  /** Streamed without a Content-Length, as chunked transfer encoding. */
  chunked?: boolean
  oversize?: boolean
}

const oversize = () => JSON.stringify({ pad: 'x'.repeat(jsonBodyMaxBytes) })
const hostileBodies: Hostile[] = [
  { label: 'an oversize JSON body', body: oversize, oversize: true },
  { label: 'an oversize JSON body sent chunked', body: () => Readable.toWeb(Readable.from([Buffer.from(oversize())])) as ReadableStream, chunked: true, oversize: true },
  { label: '10,000 nested arrays', body: () => deepArrays(10_000) },
  { label: '10,000 nested objects', body: () => deepObjects(10_000) },
  { label: 'broken JSON', body: () => '{"email": "a@example.ie", "password": ' },
  { label: 'an array instead of an object', body: () => '[1, 2, 3]' },
  { label: 'a bare string', body: () => '"just some text"' },
  { label: 'null', body: () => 'null' },
  { label: 'every field of the wrong type', body: () => JSON.stringify(Object.fromEntries(fieldNames.map((f, i) => [f, [[i], { nested: true }]]))) },
  { label: 'query operators in place of values', body: () => JSON.stringify(Object.fromEntries(fieldNames.map(f => [f, { $ne: null, $gt: '', or: [1] }]))) },
  { label: 'SQL metacharacters', body: () => JSON.stringify(sqlValues) },
  { label: 'prototype-polluting keys', body: () => '{"__proto__": {"role": "admin"}, "constructor": {"prototype": {"role": "admin"}}}' },
  { label: 'a form-encoded body with SQL and array keys', type: 'application/x-www-form-urlencoded', body: () => `email=%27+OR+1%3D1--&password[$ne]=x&status[]=closed&id=1%20OR%201=1` },
  { label: 'text/plain junk', type: 'text/plain', body: () => 'DROP TABLE users; \u0000\u0007\u00ff' },
  { label: 'a disguised executable as multipart', type: 'multipart', body: () => disguisedExecutable() },
]

function disguisedExecutable(): FormData {
  const form = new FormData()
  form.append('data', JSON.stringify({ body: 'Please see the attached drawing for the ground floor.' }))
  // Named and typed as a PDF, and under both the intake's and the reply's file field.
  form.append('drawings', new Blob([fakeExe], { type: 'application/pdf' }), 'ground-floor.pdf')
  form.append('files', new Blob([fakeExe], { type: 'application/pdf' }), 'ground-floor.pdf')
  return form
}

// Reads no body and changes nothing but the caller's own session: answers 200 whatever it is sent.
const readsNoBody = new Set(['POST /api/auth/sign-out'])

async function send(path: string, method: string, cookie: string | undefined, hostile: Hostile) {
  const headers: Record<string, string> = { accept: 'application/json', origin: new URL(url('/')).origin }
  if (cookie) headers.cookie = cookie
  const body = hostile.body()
  if (hostile.type !== 'multipart') headers['content-type'] = hostile.type ?? 'application/json'
  const res = await fetch(path, { method, headers, body, redirect: 'manual', ...(hostile.chunked ? { duplex: 'half' } : {}) } as RequestInit)
  return { status: res.status, text: await res.text() }
}

describe('hostile input on every route', async () => {
  await useBuiltServer()
  const cookies: Partial<Record<Who, string>> = {}
  const values: Record<string, string> = {}

  beforeAll(async () => {
    cookies.specA = await signIn(demo.specA)
    cookies.officer = await signIn(demo.officer)
    cookies.manager = await signIn(demo.manager)
    cookies.admin = await signIn(demo.admin)
    Object.assign(values, await matrixValues(cookies.specA))
  })
  afterAll(closeTestDb)

  const writeRoutes = Object.keys(matrix).filter(key => !key.startsWith('GET '))
  it.each(writeRoutes)('%s: every hostile body is refused with a 4xx and writes nothing', async (key) => {
    const [method] = key.split(' ') as [string]
    const caller = reachingCaller(key)
    const path = fillPath(matrix[key]!.path, values)
    const before = await databaseState()
    const filesBefore = new Set(uploadEntries())
    for (const hostile of hostileBodies) {
      const res = await send(path, method, cookies[caller], hostile)
      const context = `${key} as ${caller} with ${hostile.label}`
      if (readsNoBody.has(key)) expect(res.status, context).toBe(hostile.oversize ? 413 : 200)
      else if (hostile.oversize && key !== 'POST /api/mail/inbound') expect(res.status, context).toBe(413)
      else {
        expect(res.status, `${context}: ${res.text.slice(0, 300)}`).toBeGreaterThanOrEqual(400)
        expect(res.status, `${context}: ${res.text.slice(0, 300)}`).toBeLessThan(500)
      }
      expectNoLeak(res.text, context)
    }
    expect(await databaseState(), `${key}: a hostile body changed the database`).toEqual(before)
    expect(uploadEntries().filter(e => !filesBefore.has(e)), `${key}: a hostile body left files behind`).toEqual([])
  })

  // Route parameters: traversal, SQL, markup, odd numbers, a NUL and a very long value, in every [param].
  // (A number in another notation, 0x10 or 1e1, is read as the id it spells, so these stay clear of real ids.)
  const hostileParams = [
    '..%2F..%2F..%2Fetc%2Fpasswd', encodeURIComponent(`1' OR '1'='1`), encodeURIComponent('<script>alert(1)</script>'),
    '-1', '1e309', '0x7fffffffffffffff', '%00', encodeURIComponent('TQ-2026-0001; DROP TABLE enquiries'), 'x'.repeat(3000),
  ]
  const paramRoutes = Object.keys(matrix).filter(key => key.includes('['))
  it.each(paramRoutes)('%s: hostile route parameters are a 4xx and write nothing', async (key) => {
    const [method, route] = key.split(' ') as [string, string]
    const caller = reachingCaller(key)
    const before = await databaseState()
    for (const value of hostileParams) {
      const path = route.replace(/\[\w+\]/g, value)
      const res = await call(path, { method, cookie: cookies[caller], body: method === 'GET' ? undefined : {} })
      const context = `${method} ${path.slice(0, 120)} as ${caller}`
      expect(res.status, `${context}: ${JSON.stringify(res.body).slice(0, 300)}`).toBeGreaterThanOrEqual(400)
      expect(res.status, context).toBeLessThan(500)
      expectNoLeak(res.body, context)
    }
    expect(await databaseState()).toEqual(before)
  })

  // Query strings are optional filters: a route may ignore what it does not know (200) or refuse it (400).
  const hostileQuery = `?q=${encodeURIComponent(`' OR 1=1 --`)}&page=-1&page[]=2&status=${encodeURIComponent('<script>')}`
    + `&sort=${encodeURIComponent('id; DROP TABLE users')}&from=2026-13-45&to=${'9'.repeat(400)}&limit=1e309&officer[$ne]=1&download`
  const readRoutes = Object.keys(matrix).filter(key => key.startsWith('GET '))
  it.each(readRoutes)('%s: a hostile query string is never a 5xx nor a leak', async (key) => {
    const caller = reachingCaller(key)
    const path = fillPath(matrix[key]!.path, values)
    const res = await call(`${path}${path.includes('?') ? hostileQuery.replace('?', '&') : hostileQuery}`, { cookie: cookies[caller] })
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBeLessThan(500)
    expectNoLeak(res.body, key)
  })

  describe('uploads', () => {
    const intake = {
      requester: { name: 'Gráinne Upload', organisation: 'Upload Check Ltd', email: 'uploads@example.invalid', phone: '091 555 0101' },
      project: { name: 'Upload check house', region: 'Galway', stage: 'planning' },
      topic: 'other', subject: 'Hostile upload check', question: 'An enquiry whose drawings are checked for what they really are.', priority: 'normal',
    }
    const intakeForm = (files: { field?: string, name: string, bytes: Buffer, type?: string }[], data: string = JSON.stringify(intake)) => {
      const form = new FormData()
      form.append('data', data)
      for (const f of files) form.append(f.field ?? 'drawings', new Blob([new Uint8Array(f.bytes)], { type: f.type ?? 'application/octet-stream' }), f.name)
      return form
    }
    const html = Buffer.from('<!doctype html><html><body><script>window.__owned = 1</script></body></html>')
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>window.__owned = 1</script></svg>')
    const cases = [
      { label: 'an executable named .pdf', files: [{ name: 'section.pdf', bytes: fakeExe, type: 'application/pdf' }], status: 415 },
      { label: 'an executable with a traversal name', files: [{ name: '../../../../tmp/perpend-evil.exe', bytes: fakeExe }], status: 415 },
      { label: 'HTML named .png', files: [{ name: 'plan.png', bytes: html, type: 'image/png' }], status: 415 },
      { label: 'SVG with a script named .png', files: [{ name: 'plan.png', bytes: svg, type: 'image/png' }], status: 415 },
      { label: 'a good drawing beside a disguised one', files: [{ name: 'plan.png', bytes: tinyPng }, { name: 'plan2.pdf', bytes: fakeExe }], status: 415 },
      { label: 'an empty file', files: [{ name: 'empty.pdf', bytes: Buffer.alloc(0) }], status: 400 },
      { label: `${uploadLimits.maxFiles + 1} files`, files: Array.from({ length: uploadLimits.maxFiles + 1 }, (_, i) => ({ name: `p${i}.png`, bytes: tinyPng })), status: 400 },
      { label: 'a file under an unexpected field', files: [{ field: 'evil', name: 'plan.png', bytes: tinyPng }], status: 400 },
    ]

    it.each(cases)('the intake refuses $label ($status) and keeps nothing', async ({ files, status }) => {
      const before = await databaseState()
      const filesBefore = new Set(uploadEntries())
      const res = await callForm('/api/enquiries', intakeForm(files))
      expect(res.status, JSON.stringify(res.body)).toBe(status)
      expectNoLeak(res.body, 'intake')
      expect(await databaseState()).toEqual(before)
      expect(uploadEntries().filter(e => !filesBefore.has(e))).toEqual([])
    })

    it.each([
      { label: '10,000 nested arrays', data: deepArrays(10_000) },
      { label: 'broken JSON', data: '{"project": ' },
      { label: 'wrong types', data: JSON.stringify({ ...intake, project: 'a string', priority: ['urgent'] }) },
    ])('the intake refuses form data of $label with 400 and removes the drawing it received', async ({ data }) => {
      const before = await databaseState()
      const filesBefore = new Set(uploadEntries())
      const res = await callForm('/api/enquiries', intakeForm([{ name: 'plan.png', bytes: tinyPng }], data))
      expect(res.status, JSON.stringify(res.body)).toBe(400)
      expectNoLeak(res.body, 'intake')
      expect(await databaseState()).toEqual(before)
      expect(uploadEntries().filter(e => !filesBefore.has(e))).toEqual([])
    })

    it('a reply refuses a disguised executable and keeps nothing', async () => {
      const before = await databaseState()
      const filesBefore = new Set(uploadEntries())
      const form = new FormData()
      form.append('data', JSON.stringify({ body: 'Revised section attached.' }))
      form.append('files', new Blob([fakeExe], { type: 'application/pdf' }), 'revised.pdf')
      const res = await callForm(`/api/enquiries/${values.ref}/messages`, form, { cookie: cookies.specA })
      expect(res.status).toBe(415)
      expect(await databaseState()).toEqual(before)
      expect(uploadEntries().filter(e => !filesBefore.has(e))).toEqual([])
    })

    it('a multipart body to a route that does not stream uploads is held to the JSON limit (413)', async () => {
      const form = new FormData()
      form.append('layers', new Blob([Buffer.alloc(jsonBodyMaxBytes + 1024, 0x41)]), 'layers.json')
      const res = await callForm('/api/calc/u-value', form)
      expect(res.status).toBe(413)
      expect(res.body.message).toBe('This request may carry at most 1 MB of data.')
    })

    it('a real drawing with a traversal name is stored under a safe name inside the store, and a real PDF still goes in', async () => {
      const filesBefore = new Set(uploadEntries())
      const pdf = await makePdf('Eaves section')
      const res = await callForm('/api/enquiries', intakeForm([
        { name: '../../../../tmp/perpend-escape.png', bytes: tinyPng },
        { name: '..\\..\\windows\\win.ini.pdf', bytes: pdf },
      ]))
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      const rows = await testDb().query<{ file_name: string, storage_key: string }>(
        'SELECT a.file_name, a.storage_key FROM attachments a JOIN enquiries e ON e.id = a.enquiry_id WHERE e.ref = ? ORDER BY a.id',
        { replacements: [res.body.ref], type: QueryTypes.SELECT })
      expect(rows.map(r => r.file_name)).toEqual(['perpend-escape.png', 'win.ini.pdf'])
      for (const r of rows) expect(r.storage_key).toMatch(/^drawings:[0-9a-f-]{36}$/)
      expect(existsSync('/tmp/perpend-escape.png')).toBe(false)
      const added = uploadEntries().filter(e => !filesBefore.has(e) && !e.endsWith('/'))
      expect(added).toHaveLength(2)
      for (const entry of added) expect(entry).toMatch(/^drawings\/[0-9a-f-]{36}$/)
    })
  })

  it('text with SQL in it is stored and shown verbatim, and every table is still there', async () => {
    const text = `Robert'); DROP TABLE enquiries; -- and " OR 1=1; SELECT * FROM users WHERE '' = ''`
    const res = await call(`/api/enquiries/${values.ref}/messages`, { cookie: cookies.specA, body: { body: text } })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const file = await call(`/api/enquiries/${values.ref}`, { cookie: cookies.specA })
    expect(file.body.messages.map((m: { body: string }) => m.body)).toContain(text)
    const state = await databaseState()
    for (const table of ['enquiries', 'users', 'enquiry_messages', 'attachments']) expect(state[`${table} rows`]).toBeDefined()
  })
})
