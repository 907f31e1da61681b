import { randomUUID } from 'node:crypto'
import { defaults as ironDefaults, seal } from 'iron-webcrypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { call, callForm, currentYear, demo, signIn } from '../support/api'
import { closeTestDb } from '../support/db'
import { makePdf } from '../support/files'
import { fillPath, matrix, matrixValues } from '../support/routes'
import type { Who } from '../support/routes'
import { databaseState, expectNoLeak, reachingCaller } from '../support/security'
import { useBuiltServer } from '../support/server'

const COOKIE = 'perpend-session'
const MAX_AGE_MS = 12 * 60 * 60_000 // runtimeConfig.session.maxAge

/** A session cookie as h3 seals one ({ id, createdAt, data }), with any password and clock. */
async function sealedCookie(data: Record<string, unknown>, password: string, { ageMs = 0 } = {}) {
  const session = { id: randomUUID(), createdAt: Date.now() - ageMs, data }
  const sealed = await seal(globalThis.crypto as Parameters<typeof seal>[0], session, password, { ...ironDefaults, ttl: MAX_AGE_MS, localtimeOffsetMsec: -ageMs })
  return `${COOKIE}=${sealed}`
}

describe('sessions, cross-site writes and other organisations\' records', async () => {
  await useBuiltServer()
  const cookies: Partial<Record<Who, string>> = {}
  const values: Record<string, string> = {}
  let specAUser: { id: number, name: string, email: string, organisationId: number }

  // An enquiry of Halloran Reid's (specifier A) with a drawing, an issued pack and a quotation, and one of
  // Keel Structural's (specifier B). Arranged with the rest, before any test: @nuxt/test-utils lends its server
  // context to hooks only until the first test has run.
  let ref: string
  let drawingId: number
  let packId: number
  let packAttachmentId: number
  let quotationAttachmentId: number
  let refB: string
  async function arrangeOtherFirmRecords() {
    const form = new FormData()
    form.append('data', JSON.stringify({
      project: { name: 'Isolation check terrace', region: 'Kerry', stage: 'tender' },
      topic: 'other', subject: 'Records of one firm only', question: 'An enquiry whose records no other firm may see or guess.', priority: 'normal',
    }))
    form.append('drawings', new Blob([new Uint8Array(await makePdf('Terrace section'))]), 'terrace.pdf')
    const created = await callForm('/api/enquiries', form, { cookie: cookies.specA })
    expect(created.status).toBe(201)
    ref = created.body.ref
    const file = await call(`/api/enquiries/${ref}`, { cookie: cookies.specA })
    drawingId = file.body.attachments[0].id
    const pack = await call(`/api/enquiries/${ref}/packs`, { cookie: cookies.officer, body: { replyBody: 'See the window jamb detail attached.', items: ['D-WIN-03'], calculationIds: [] } })
    expect(pack.status, JSON.stringify(pack.body)).toBe(201)
    packId = pack.body.pack.id
    packAttachmentId = pack.body.pack.attachment.id
    const quotation = await call(`/api/enquiries/${ref}/quotations`, {
      cookie: cookies.officer,
      body: {
        scope: 'supply', discountPercent: 0, vatPercent: 23, validUntil: `${currentYear() + 1}-03-31`,
        quantities: { area_m2: 200, openings_m2: 30, baseLength_m: 40, openingsCount: 12, openingsPerimeter_m: 70, openingHeads_m: 18, externalCorners_m: 20, system: { block: { length_mm: 440, height_mm: 215, thickness_mm: 300 } } },
      },
    })
    expect(quotation.status, JSON.stringify(quotation.body)).toBe(201)
    quotationAttachmentId = quotation.body.quotation.attachmentId
    // One of Keel Structural's own (specifier B), to pair with A's ids.
    const own = await call('/api/enquiries', {
      cookie: cookies.specB,
      body: { project: { name: 'Keel yard office', region: 'Cork', stage: 'planning' }, topic: 'other', subject: 'Keel\'s own enquiry', question: 'An enquiry of the other firm, to pair with the first firm\'s ids.', priority: 'normal' },
    })
    expect(own.status).toBe(201)
    refB = own.body.ref
  }

  beforeAll(async () => {
    cookies.specA = await signIn(demo.specA)
    cookies.specB = await signIn(demo.specB)
    cookies.officer = await signIn(demo.officer)
    cookies.manager = await signIn(demo.manager)
    cookies.admin = await signIn(demo.admin)
    Object.assign(values, await matrixValues(cookies.specA))
    const me = await call('/api/auth/me', { cookie: cookies.specA })
    specAUser = me.body.user
    await arrangeOtherFirmRecords()
  })
  afterAll(closeTestDb)

  describe('a tampered, foreign or expired session cookie is a signed-out caller, never a 500', () => {
    const password = () => process.env.NUXT_SESSION_PASSWORD!
    const flip = (cookie: string, at: number) => {
      const value = cookie.slice(COOKIE.length + 1)
      const i = Math.floor(value.length * at)
      return `${COOKIE}=${value.slice(0, i)}${value[i] === 'A' ? 'B' : 'A'}${value.slice(i + 1)}`
    }
    const cases: { label: string, cookie: () => Promise<string> | string }[] = [
      { label: 'one byte changed in the sealed data', cookie: () => flip(cookies.specA!, 0.5) },
      { label: 'one byte changed in the signature', cookie: () => flip(cookies.specA!, 0.97) },
      { label: 'cut short', cookie: () => cookies.specA!.slice(0, Math.floor(cookies.specA!.length * 0.7)) },
      { label: 'not a seal at all', cookie: () => `${COOKIE}=Fe26.2**not-a-seal*at*all` },
      { label: 'sealed with another password', cookie: () => sealedCookie({ user: { ...specAUser, role: 'admin' } }, 'another-password-that-is-long-enough-0123456789') },
      { label: 'expired (13 hours old)', cookie: () => sealedCookie({ user: specAUser }, password(), { ageMs: 13 * 60 * 60_000 }) },
      { label: 'for a person who does not exist', cookie: () => sealedCookie({ user: { ...specAUser, id: 987654 } }, password()) },
    ]

    it.each(cases)('$label', async ({ cookie }) => {
      const value = await cookie()
      for (const path of ['/api/my/enquiries', '/api/enquiries', `/api/enquiries/${values.ref}`, '/api/admin/users']) {
        const res = await call(path, { cookie: value })
        expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(401)
        expectNoLeak(res.body, path)
      }
      expect((await call('/api/auth/me', { cookie: value })).body.user).toBeNull()
      const page = await call('/my-enquiries', { cookie: value, headers: { accept: 'text/html' } })
      expect(page.status).toBeLessThan(500)
      expect(String(page.body)).not.toContain(specAUser.email)
    })

    it('a correctly sealed cookie that claims a higher role gets the role the database has', async () => {
      const forged = await sealedCookie({ user: { ...specAUser, role: 'admin' } }, password())
      expect((await call('/api/admin/users', { cookie: forged })).status).toBe(403)
      expect((await call('/api/enquiries', { cookie: forged })).status).toBe(403)
      expect((await call('/api/auth/me', { cookie: forged })).body.user.role).toBe('specifier')
    })

    it('an oversize cookie header is refused with a 4xx', async () => {
      const res = await call('/api/enquiries', { cookie: `${COOKIE}=${'A'.repeat(20_000)}` })
      expect(res.status).toBeGreaterThanOrEqual(400)
      expect(res.status).toBeLessThan(500)
    })
  })

  describe('cross-site writes: every non-GET route refuses a request that does not come from a Perpend page', () => {
    const forgeries: { label: string, headers: () => Record<string, string>, origin: string | false }[] = [
      { label: 'no Origin nor Referer', headers: () => ({}), origin: false },
      { label: 'a foreign Origin', headers: () => ({}), origin: 'https://evil.example' },
      { label: 'Origin null (a sandboxed frame or a data: page)', headers: () => ({}), origin: 'null' },
      { label: 'only a foreign Referer', headers: () => ({ referer: 'https://evil.example/page' }), origin: false },
      { label: 'the site\'s host inside a foreign one', headers: () => ({}), origin: 'http://127.0.0.1.evil.example' },
      { label: 'the same host on another port', headers: () => ({}), origin: 'http://127.0.0.1:1' },
    ]
    const writeRoutes = Object.keys(matrix).filter(key => !key.startsWith('GET ') && key !== 'POST /api/mail/inbound')

    it.each(writeRoutes)('%s', async (key) => {
      const [method] = key.split(' ') as [string]
      const caller = reachingCaller(key)
      const path = fillPath(matrix[key]!.path, values)
      const before = await databaseState()
      for (const forgery of forgeries) {
        const res = await call(path, { method, cookie: cookies[caller], origin: forgery.origin, headers: forgery.headers(), body: {} })
        expect(res.status, `${key} as ${caller} with ${forgery.label}`).toBe(403)
        expect(res.body.message).toBe('This change must be made from a Perpend page. Reload the page and try again.')
      }
      expect(await databaseState()).toEqual(before)
    })

    it('the mail provider\'s hook is exempt from the Origin check and answers only to its shared secret', async () => {
      const res = await call('/api/mail/inbound', { origin: false, headers: { 'content-type': 'message/rfc822' }, body: 'x' })
      expect(res.status).toBe(401)
    })
  })

  describe('another organisation\'s records answer 404, exactly like records that do not exist', () => {
    it('by reference: the file, its calculations, packs and quotations', async () => {
      const missing = `TQ-${currentYear()}-99999`
      for (const tail of ['', '/calculations', '/packs', '/quotations']) {
        const theirs = await call(`/api/enquiries/${ref}${tail}`, { cookie: cookies.specB })
        const none = await call(`/api/enquiries/${missing}${tail}`, { cookie: cookies.specB })
        expect(theirs.status, tail).toBe(404)
        expect({ status: none.status, message: none.body.message }).toEqual({ status: theirs.status, message: theirs.body.message })
        expect(JSON.stringify(theirs.body)).not.toContain('Isolation check terrace')
      }
      // The owner's organisation still sees them.
      expect((await call(`/api/enquiries/${ref}/packs`, { cookie: cookies.specA })).body.packs).toHaveLength(1)
    })

    it('by attachment id: the drawing, the pack PDF and the quotation PDF, under their enquiry or under one\'s own', async () => {
      for (const id of [drawingId, packAttachmentId, quotationAttachmentId]) {
        expect((await call(`/api/enquiries/${ref}/attachments/${id}`, { cookie: cookies.specA })).status).toBe(200)
        for (const under of [ref, refB]) {
          const res = await call(`/api/enquiries/${under}/attachments/${id}`, { cookie: cookies.specB })
          expect(res.status, `${under}/${id}`).toBe(404)
        }
      }
    })

    it('a reply to another firm\'s enquiry is 404 and writes nothing; their enquiry is not in one\'s own list', async () => {
      const before = await databaseState()
      const res = await call(`/api/enquiries/${ref}/messages`, { cookie: cookies.specB, body: { body: 'A reply slipped into another firm\'s enquiry.' } })
      expect(res.status).toBe(404)
      expect(await databaseState()).toEqual(before)
      const mine = await call('/api/my/enquiries', { cookie: cookies.specB })
      expect(JSON.stringify(mine.body)).not.toContain(ref)
      expect(JSON.stringify(mine.body)).toContain(refB)
    })

    it('the requester page of another firm\'s enquiry shows nothing of it', async () => {
      const page = await call(`/my-enquiries/${ref}`, { cookie: cookies.specB, headers: { accept: 'text/html' } })
      expect(page.status).toBeLessThan(500)
      expect(String(page.body)).not.toContain('Records of one firm only')
      expect(String(page.body)).not.toContain('terrace.pdf')
    })

    it('a staff-only route keyed by id refuses a specifier before looking the id up (existing or not)', async () => {
      for (const id of [packId, 999999]) {
        const res = await call(`/api/packs/${id}/approve`, { cookie: cookies.specB, body: {} })
        expect(res.status).toBe(403)
        expect(res.body.message).toBe('Your account cannot do this')
      }
    })
  })
})
