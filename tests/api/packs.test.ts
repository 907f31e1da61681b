import { execFileSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { fetch } from '@nuxt/test-utils/e2e'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import type { CaughtMail } from '../../scripts/mail-catcher'
import { packCautionTexts } from '../../shared/schemas/pack'
import { call, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { enquiryInHand as inHand } from '../support/enquiries'
import { rootDir, useBuiltServer } from '../support/server'
import { demoWall } from '../support/walls'
import { pdfText } from '../support/pdf'

const catcher = await startMailCatcher({ port: 0 })
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex')
const outDir = join(rootDir, 'test-output', 'packs')

async function rows<T extends object>(sql: string, replacements: unknown[] = []): Promise<T[]> {
  return testDb().query<T>(sql, { replacements, type: QueryTypes.SELECT })
}

const intake = (topic: string, subject: string) => ({
  project: { name: 'Glenmore Terrace', region: 'Cork', stage: 'tender' },
  topic,
  subject,
  question: 'How is the frame fixed at the jamb with 150 mm EPS on the 215 mm block, and what U-value does the wall reach?',
  priority: 'normal',
})

describe('response packs', async () => {
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}` })
  let officer = ''
  let officer2 = ''
  let specA = ''
  let specB = ''
  let officerId = 0
  beforeAll(async () => {
    [officer, officer2, specA, specB] = await Promise.all([signIn(demo.officer), signIn(demo.officer2), signIn(demo.specA), signIn(demo.specB)])
    const [row] = await rows<{ id: number }>('SELECT id FROM users WHERE email = ?', [demo.officer])
    officerId = row!.id
    mkdirSync(outDir, { recursive: true })
  })
  afterAll(async () => {
    await catcher.close()
    await closeTestDb()
  })

  /** A new enquiry of specifier A's, taken in hand by the officer. */
  const enquiryInHand = (topic: string, subject: string) => inHand({ specifier: specA, officer }, intake(topic, subject))

  async function saveCalculation(ref: string): Promise<number> {
    const res = await call(`/api/enquiries/${ref}/calculations`, { cookie: officer, body: { method: 'u-value', inputs: demoWall } })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    return res.body.calculation.id as number
  }

  /** Counts of everything an issue writes, to show a refused request wrote nothing. */
  async function footprint(enquiryId: number): Promise<{ packs: number, messages: number, attachments: number, mails: number }> {
    const [r] = await rows<Record<string, number>>(`SELECT
      (SELECT COUNT(*) FROM response_packs WHERE enquiry_id = ?) AS packs,
      (SELECT COUNT(*) FROM enquiry_messages WHERE enquiry_id = ?) AS messages,
      (SELECT COUNT(*) FROM attachments WHERE enquiry_id = ?) AS attachments,
      (SELECT COUNT(*) FROM outbox_messages WHERE enquiry_id = ?) AS mails`, [enquiryId, enquiryId, enquiryId, enquiryId])
    return { packs: Number(r!.packs), messages: Number(r!.messages), attachments: Number(r!.attachments), mails: Number(r!.mails) }
  }

  const packMail = (ref: string, revision: string) => catcher.waitFor(m => m.subject.startsWith(`Re: ${ref}`) && m.attachments.some(a => a.filename === `${ref}-response-rev-${revision}.pdf`))
  const pdfOf = (mail: CaughtMail) => mail.attachments.find(a => a.contentType === 'application/pdf')!

  describe('a pack with one detail and one calculation', () => {
    let e: { ref: string, id: number }
    let calcId = 0
    let revA: { attachmentId: number, sha: string } | null = null
    const reply = 'The frame is fixed through the reveal into the block, with the connection profile closing the joint to the render.'

    beforeAll(async () => {
      e = await enquiryInHand('junctions', 'Window jamb with 150 mm EPS at plot 4')
      calcId = await saveCalculation(e.ref)
    })

    it('issues revision A at once: mailed with the PDF, threaded, the enquiry answered', async () => {
      const before = await rows<{ message_id: string }>('SELECT message_id FROM outbox_messages WHERE enquiry_id = ? ORDER BY id', [e.id])
      expect(before.length).toBeGreaterThan(0) // the acknowledgement of the intake
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: `## Fixing at the jamb\n\n${reply}\n\n- See D-WIN-03 attached.`, items: ['d-win-03'], calculationIds: [calcId] } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.pack).toMatchObject({ revision: 'A', status: 'issued', checker: null, calculationIds: [calcId] })
      expect(res.body.pack.items).toEqual([{ code: 'D-WIN-03', revision: 'B', revisionDate: '2024-10-14', title: 'Window jamb, frame at block face', collection: 'details' }])
      expect(res.body.pack.cautions).toContain('general')
      expect(res.body.pack.attachment.fileName).toBe(`${e.ref}-response-rev-A.pdf`)

      const mail = await packMail(e.ref, 'A')
      expect(mail.envelopeTo).toEqual(['architect@hallorans.example'])
      expect(mail.text).toContain(reply)
      expect(mail.headers['in-reply-to']).toBe(before.at(-1)!.message_id)
      for (const r of before) expect(mail.headers.references).toContain(r.message_id)
      expect(mail.headers['reply-to']).toMatch(/\+[0-9a-f]{32}@/)
      const pdf = pdfOf(mail)
      expect(pdf.filename).toBe(`${e.ref}-response-rev-A.pdf`)
      const [stored] = await rows<{ id: number, sha256: string, internal: number, message_id: number }>('SELECT id, sha256, internal, message_id FROM attachments WHERE id = ?', [res.body.pack.attachment.id])
      expect(sha256(pdf.content)).toBe(stored!.sha256)
      expect(Number(stored!.internal)).toBe(0)
      revA = { attachmentId: stored!.id, sha: stored!.sha256 }

      const [enquiry] = await rows<{ status: string, first_response_at: Date | null }>('SELECT status, first_response_at FROM enquiries WHERE id = ?', [e.id])
      expect(enquiry).toMatchObject({ status: 'answered' })
      expect(enquiry!.first_response_at).not.toBeNull()
      const [event] = await rows<{ from_value: string, to_value: string }>('SELECT from_value, to_value FROM enquiry_events WHERE enquiry_id = ? AND kind = \'status\' ORDER BY id DESC LIMIT 1', [e.id])
      expect(event).toEqual({ from_value: 'in_hand', to_value: 'answered' })
      const [message] = await rows<{ kind: string, body: string }>('SELECT kind, body FROM enquiry_messages WHERE id = ?', [stored!.message_id])
      expect(message!.kind).toBe('reply')
      expect(message!.body).toContain(reply)
    })

    it('the PDF holds the reference, the reply, each item\'s title, the calculation, cautions, revision and page numbers', async () => {
      const mail = await packMail(e.ref, 'A')
      const bytes = new Uint8Array(pdfOf(mail).content)
      const { pages, text } = await pdfText(bytes)
      // cover, reply, one calculation, the detail sheet (drawing and notes may run to two pages), cautions
      expect(pages).toBeGreaterThanOrEqual(5)
      expect(text).toContain(e.ref)
      expect(text).toContain(reply)
      expect(text).toContain('Window jamb, frame at block face')
      expect(text).toContain('D-WIN-03')
      expect(text).toContain('U-value (EN ISO 6946)')
      expect(text).toContain('EN ISO 6946:2017')
      expect(text).toContain('Niamh Brennan')
      expect(text).toContain('Glenmore Terrace')
      expect(text).toContain(`Page 1 of ${pages}`)
      expect(text).toContain(`Page ${pages} of ${pages}`)
      expect(text).toContain('Revision A')
      expect(text).toContain('not a compliance certificate')

      const file = join(outDir, 'pack.pdf')
      writeFileSync(file, bytes)
      execFileSync('pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', '-singlefile', file, join(outDir, 'pack-page1')])
      const png = readFileSync(join(outDir, 'pack-page1.png'))
      expect(png.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a')
      expect(png.length).toBeGreaterThan(5_000) // a page with text on it, not a blank one
    })

    it('re-issues as revision B and leaves revision A as it was', async () => {
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'Corrected: the reveal board is 30 mm, as on the sheet.', items: ['D-WIN-03'], calculationIds: [] } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.pack).toMatchObject({ revision: 'B', status: 'issued' })
      const mail = await packMail(e.ref, 'B')
      expect((await pdfText(new Uint8Array(pdfOf(mail).content))).text).toContain('Revision B')
      const [a] = await rows<{ sha256: string }>('SELECT sha256 FROM attachments WHERE id = ?', [revA!.attachmentId])
      expect(a!.sha256).toBe(revA!.sha)
      const download = await fetch(`/api/enquiries/${e.ref}/attachments/${revA!.attachmentId}`, { headers: { cookie: officer } })
      expect(sha256(new Uint8Array(await download.arrayBuffer()))).toBe(revA!.sha)
      const list = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer })
      expect(list.body.packs.map((p: { revision: string }) => p.revision)).toEqual(['B', 'A'])
    })

    it('the requester\'s organisation sees the issued packs and downloads the PDF; another organisation gets 404', async () => {
      const list = await call(`/api/enquiries/${e.ref}/packs`, { cookie: specA })
      expect(list.status).toBe(200)
      expect(list.body.packs.map((p: { revision: string, status: string }) => `${p.revision}:${p.status}`)).toEqual(['B:issued', 'A:issued'])
      const url = list.body.packs[1].attachment.url as string
      const download = await fetch(url, { headers: { cookie: specA } })
      expect(download.status).toBe(200)
      expect(download.headers.get('content-type')).toBe('application/pdf')
      expect(sha256(new Uint8Array(await download.arrayBuffer()))).toBe(revA!.sha)

      expect((await call(`/api/enquiries/${e.ref}/packs`, { cookie: specB })).status).toBe(404)
      expect((await fetch(url, { headers: { cookie: specB } })).status).toBe(404)
    })

    it.each([
      { label: 'an unknown library code', body: () => ({ replyBody: 'See the sheet.', items: ['D-ZZZ-99'] }), message: /no library item D-ZZZ-99/ },
      { label: 'a malformed library code', body: () => ({ replyBody: 'See the sheet.', items: ['window'] }), message: /not a library code/ },
      { label: 'no reply text', body: () => ({ replyBody: '   ', items: ['D-WIN-03'] }), message: /Write the reply text/ },
      { label: 'the author as checker', body: () => ({ replyBody: 'See the sheet.', checkerId: officerId }), message: /second officer/ },
    ])('refuses $label with 400 and writes nothing', async ({ body, message }) => {
      const before = await footprint(e.id)
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: body() })
      expect(res.status, JSON.stringify(res.body)).toBe(400)
      expect(res.body.message).toMatch(message)
      expect(await footprint(e.id)).toEqual(before)
    })

    it('refuses a calculation saved to another enquiry with 400 and writes nothing', async () => {
      const other = await enquiryInHand('thermal', 'U-value of the gable wall')
      const foreign = await saveCalculation(other.ref)
      const before = await footprint(e.id)
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'The U-value is attached.', calculationIds: [calcId, foreign] } })
      expect(res.status, JSON.stringify(res.body)).toBe(400)
      expect(res.body.message).toMatch(new RegExp(`calculationIds.1: Calculation ${foreign} is not saved to ${e.ref}`))
      expect(await footprint(e.id)).toEqual(before)
    })

    it.each([
      { who: 'specifier of the organisation', cookie: () => specA, status: 403 },
      { who: 'specifier of another organisation', cookie: () => specB, status: 403 },
      { who: 'nobody signed in', cookie: () => undefined, status: 401 },
    ])('refuses to compose for $who', async ({ cookie, status }) => {
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: cookie(), body: { replyBody: 'A reply.' } })
      expect(res.status).toBe(status)
    })
  })

  describe('a wind-topic enquiry needs a second officer\'s check', () => {
    it('waits for the check, refuses the author\'s approval, issues on another officer\'s', async () => {
      const e = await enquiryInHand('wind', 'Anchor pattern at the corners of block C')
      const before = await footprint(e.id)
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'Use the edge-zone anchor pattern of C-ANC-02 at the corners.', items: ['C-ANC-02'] } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.pack).toMatchObject({ revision: 'A', status: 'awaiting-check', attachment: null })
      expect(res.body.pack.cautions).toEqual(expect.arrayContaining(['wind', 'general']))
      // Nothing goes out before the check: no reply, no PDF, no mail.
      expect(await footprint(e.id)).toEqual({ ...before, packs: before.packs + 1 })
      expect((await call(`/api/enquiries/${e.ref}/packs`, { cookie: specA })).body.packs).toEqual([])
      // Nor can a second pack be composed past the one waiting.
      expect((await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'Another try.' } })).status).toBe(409)

      const id = res.body.pack.id as number
      expect((await call(`/api/packs/${id}/approve`, { cookie: officer, body: {} })).status).toBe(403)
      expect((await call(`/api/packs/${id}/approve`, { cookie: specA, body: {} })).status).toBe(403)
      const approved = await call(`/api/packs/${id}/approve`, { cookie: officer2, body: {} })
      expect(approved.status, JSON.stringify(approved.body)).toBe(200)
      expect(approved.body.pack).toMatchObject({ status: 'issued', checker: { name: 'Tomás Whelan' } })
      expect((await call(`/api/packs/${id}/approve`, { cookie: officer2, body: {} })).status).toBe(409)

      const mail = await packMail(e.ref, 'A')
      const { text } = await pdfText(new Uint8Array(pdfOf(mail).content))
      expect(text).toContain('Tomás Whelan')
      expect(text).toContain(packCautionTexts.wind.title)
      expect(text).toContain('C-ANC-02')
      const [enquiry] = await rows<{ status: string }>('SELECT status FROM enquiries WHERE id = ?', [e.id])
      expect(enquiry!.status).toBe('answered')
      const list = await call(`/api/enquiries/${e.ref}/packs`, { cookie: specA })
      expect(list.body.packs).toHaveLength(1)
      expect(list.body.packs[0].checker.name).toBe('Tomás Whelan')
    })

    it('a nominated checker is the only one who may approve', async () => {
      const e = await enquiryInHand('fire', 'Fire barrier at the second floor line')
      const [manager] = await rows<{ id: number }>('SELECT id FROM users WHERE email = ?', [demo.manager])
      const res = await call(`/api/enquiries/${e.ref}/packs`, { cookie: officer, body: { replyBody: 'The barrier follows C-FIR-01.', items: ['C-FIR-01'], checkerId: manager!.id } })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.pack.cautions).toEqual(expect.arrayContaining(['fire', 'general']))
      const id = res.body.pack.id as number
      expect((await call(`/api/packs/${id}/approve`, { cookie: officer2, body: {} })).status).toBe(403)
      const manager2 = await signIn(demo.manager)
      expect((await call(`/api/packs/${id}/approve`, { cookie: manager2, body: {} })).status).toBe(200)
      await packMail(e.ref, 'A')
    })

    it('an unknown pack answers 404 to staff', async () => {
      expect((await call('/api/packs/999999/approve', { cookie: officer2, body: {} })).status).toBe(404)
    })
  })
})
