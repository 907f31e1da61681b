import { createHash } from 'node:crypto'
import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import { call, callForm, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { dxfText, fakeExe, ifcText, makePdf, tinyPng } from '../support/files'
import { useBuiltServer } from '../support/server'

const catcher = await startMailCatcher({ port: 0 })
const uploadDir = process.env.NUXT_UPLOAD_DIR!

const intake = (overrides: Record<string, unknown> = {}) => ({
  requester: { name: 'Sinéad Public', organisation: 'Walk-in Design', email: 'sinead@walkin.example', phone: '+353 1 555 0100' },
  project: { name: 'Harbour View houses', region: 'Wexford', stage: 'planning', storeys: 2 },
  topic: 'thermal',
  subject: 'U-value with 100 mm graphite EPS',
  question: 'What U-value does the 215 mm block give with **100 mm** graphite EPS and silicone render?',
  priority: 'normal',
  ...overrides,
})

function form(data: unknown, files: { name: string, bytes: Buffer | string, type?: string }[] = [], field = 'drawings') {
  const f = new FormData()
  f.append('data', JSON.stringify(data))
  for (const file of files) f.append(field, new Blob([typeof file.bytes === 'string' ? file.bytes : new Uint8Array(file.bytes)], { type: file.type ?? 'application/octet-stream' }), file.name)
  return f
}

async function count(table: string): Promise<number> {
  const [row] = await testDb().query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${table}`, { type: QueryTypes.SELECT })
  return Number(row!.n)
}

/** Everything an upload could leave behind: rows in three tables, and files in the store or its incoming area. */
async function footprint() {
  const stored = existsSync(join(uploadDir, 'drawings')) ? readdirSync(join(uploadDir, 'drawings')).length : 0
  const incoming = existsSync(join(uploadDir, '.incoming')) ? readdirSync(join(uploadDir, '.incoming')).length : 0
  return { enquiries: await count('enquiries'), attachments: await count('attachments'), outbox: await count('outbox_messages'), stored, incoming }
}

describe('the enquiry desk', async () => {
  await useBuiltServer({ NUXT_MAIL_URL: `smtp://127.0.0.1:${catcher.port}` })
  let officer = ''
  let manager = ''
  let specA = ''
  let specB = ''
  beforeAll(async () => {
    [officer, manager, specA, specB] = await Promise.all([signIn(demo.officer), signIn(demo.manager), signIn(demo.specA), signIn(demo.specB)])
  })
  afterAll(async () => {
    await catcher.close()
    await closeTestDb()
  })

  describe('intake', () => {
    it('takes an anonymous enquiry, gives it a TQ reference and acknowledges it by e-mail with a reply address', async () => {
      const res = await call('/api/enquiries', { body: intake() })
      expect(res.status).toBe(201)
      expect(res.body.ref).toMatch(/^TQ-\d{4}-\d{4,}$/)
      const mail = await catcher.waitFor(m => m.subject.startsWith(`${res.body.ref} received`))
      expect(mail.envelopeTo).toEqual(['sinead@walkin.example'])
      expect(mail.headers['reply-to']).toMatch(/\+[0-9a-f]{32}@/)
      expect(mail.headers['message-id']).toMatch(/^<.+@.+>$/)
      expect(mail.text).toContain(res.body.ref)
    })

    it('stores drawings checked from their bytes, with their SHA-256, and shows them only to those who may see the enquiry', async () => {
      const pdf = await makePdf('Ground floor junction, plot 3')
      const res = await callForm('/api/enquiries', form(intake(), [
        { name: 'junction.pdf', bytes: pdf },
        { name: 'photo.png', bytes: tinyPng },
        { name: 'site.dxf', bytes: dxfText },
        { name: 'model.ifc', bytes: ifcText },
      ]), { cookie: specA })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.attachments).toBe(4)
      const file = await call(`/api/enquiries/${res.body.ref}`, { cookie: specA })
      const types = file.body.attachments.map((a: { fileType: string }) => a.fileType)
      expect([...types].sort()).toEqual(['dxf', 'ifc', 'pdf', 'png'])
      const pdfRow = file.body.attachments.find((a: { fileType: string }) => a.fileType === 'pdf')
      expect(pdfRow.sha256).toBe(createHash('sha256').update(pdf).digest('hex'))
      const own = await call(pdfRow.url, { cookie: specA })
      expect(own.status).toBe(200)
      expect(own.headers.get('content-type')).toBe('application/pdf')
      expect(own.headers.get('x-content-type-options')).toBe('nosniff')
      expect((await call(pdfRow.url, { cookie: specB })).status).toBe(404)
      expect((await call(pdfRow.url)).status).toBe(401)
    })

    it.each([
      ['a missing subject', { subject: undefined }, /subject/],
      ['an unknown topic', { topic: 'astrology' }, /topic/],
      ['storeys as text', { project: { name: 'X house', region: 'Cork', stage: 'tender', storeys: 'five' } }, /storeys/],
      ['no requester details when not signed in', { requester: undefined }, /requester/],
      ['an unknown stage', { project: { name: 'X house', region: 'Cork', stage: 'dreaming' } }, /stage/],
    ])('refuses %s with a clear 400 and writes nothing', async (_label, change, message) => {
      const before = await footprint()
      const res = await call('/api/enquiries', { body: intake(change) })
      expect(res.status).toBe(400)
      expect(res.body.message).toMatch(message)
      expect(await footprint()).toEqual(before)
    })

    it('refuses a disguised executable named .pdf and writes no row and no file', async () => {
      const before = await footprint()
      const res = await callForm('/api/enquiries', form(intake(), [
        { name: 'fine.png', bytes: tinyPng },
        { name: 'drawing.pdf', bytes: fakeExe, type: 'application/pdf' },
      ]))
      expect(res.status).toBe(415)
      expect(res.body.message).toMatch(/drawing\.pdf" is not a PDF/)
      expect(await footprint()).toEqual(before)
    })

    it('refuses a file over 100 MB with 413 and leaves nothing behind', async () => {
      const before = await footprint()
      const big = Buffer.alloc(100 * 1024 * 1024 + 1, 0x20)
      big.write('%PDF-1.7\n', 0)
      const res = await callForm('/api/enquiries', form(intake(), [{ name: 'huge.pdf', bytes: big }]))
      expect(res.status).toBe(413)
      expect(await footprint()).toEqual(before)
    })

    it('refuses more than 20 files', async () => {
      const before = await footprint()
      const files = Array.from({ length: 21 }, (_, i) => ({ name: `p${i}.png`, bytes: tinyPng }))
      const res = await callForm('/api/enquiries', form(intake(), files))
      expect(res.status).toBe(400)
      expect(res.body.message).toMatch(/at most 20 files/)
      expect(await footprint()).toEqual(before)
    })

    it('keeps a path-like or hostile file name out of the stored name', async () => {
      const res = await callForm('/api/enquiries', form(intake(), [{ name: '../../etc/<script>passwd.png', bytes: tinyPng }]), { cookie: specA })
      expect(res.status).toBe(201)
      const file = await call(`/api/enquiries/${res.body.ref}`, { cookie: specA })
      const name = file.body.attachments[0].fileName as string
      expect(name).not.toMatch(/[/\\<>]/)
      expect(name.endsWith('.png')).toBe(true)
    })

    it('never gives two concurrent submissions the same reference', async () => {
      const results = await Promise.all(Array.from({ length: 25 }, (_, i) => call('/api/enquiries', { body: intake({ subject: `Concurrent query number ${i}` }) })))
      expect(results.map(r => r.status)).toEqual(Array(25).fill(201))
      const refs = results.map(r => r.body.ref as string)
      expect(new Set(refs).size).toBe(25)
      const seqs = refs.map(r => Number(r.split('-')[2])).sort((a, b) => a - b)
      expect(seqs.at(-1)! - seqs[0]!).toBe(24)
    })
  })

  describe('working the desk', () => {
    let ref = ''

    it('lists it in the queue with filters, counts per status and the service clock', async () => {
      ref = (await call('/api/enquiries', { body: intake({ subject: 'Anchors at the parapet of block C', topic: 'wind' }), cookie: specA })).body.ref
      const queue = await call(`/api/enquiries?status=received&topic=wind&q=${encodeURIComponent('parapet')}`, { cookie: officer })
      expect(queue.status).toBe(200)
      expect(queue.body.enquiries.map((e: { ref: string }) => e.ref)).toContain(ref)
      const row = queue.body.enquiries.find((e: { ref: string }) => e.ref === ref)
      expect(row.clock.state).toBe('running')
      expect(row.clock.clock).toBe('first-response')
      expect(queue.body.countsByStatus.received).toBeGreaterThanOrEqual(1)
      const byRef = await call(`/api/enquiries?q=${ref}`, { cookie: officer })
      expect(byRef.body.enquiries.map((e: { ref: string }) => e.ref)).toEqual([ref])
      const page2 = await call('/api/enquiries?pageSize=5&page=2', { cookie: officer })
      expect(page2.body.enquiries.length).toBeLessThanOrEqual(5)
      expect(page2.body.page).toBe(2)
    })

    it('refuses bad queue filters with a 400', async () => {
      expect((await call('/api/enquiries?status=lost', { cookie: officer })).status).toBe(400)
      expect((await call('/api/enquiries?pageSize=100000', { cookie: officer })).status).toBe(400)
    })

    it('lets an officer take it, note it internally and ask the requester, recording every change', async () => {
      const me = (await call('/api/auth/me', { cookie: officer })).body.user
      const take = await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { assigneeId: me.id, status: 'in_hand' } })
      expect(take.status).toBe(200)
      expect((await call(`/api/enquiries/${ref}/messages`, { cookie: officer, body: { kind: 'note', body: 'Check the exposure: terrain II?' } })).status).toBe(201)
      const ask = await call(`/api/enquiries/${ref}/messages`, { cookie: officer, body: { kind: 'reply', body: 'Could you send the elevation with the parapet height?' } })
      expect(ask.status).toBe(201)
      const mail = await catcher.waitFor(m => m.subject.startsWith(`Re: ${ref}`))
      expect(mail.headers['in-reply-to']).toMatch(/^<.+>$/)
      const wait = await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'waiting_on_requester' } })
      expect(wait.body.clock.state).toBe('paused')
      const file = await call(`/api/enquiries/${ref}`, { cookie: officer })
      const statusEvents = file.body.events.filter((e: { kind: string }) => e.kind === 'status').map((e: { from: string, to: string }) => `${e.from}→${e.to}`)
      expect(statusEvents).toEqual(['null→received', 'received→in_hand', 'in_hand→waiting_on_requester'])
      expect(file.body.events.find((e: { kind: string }) => e.kind === 'assignee').actor).toBe('Niamh Brennan')
    })

    it('never shows internal notes to the requester', async () => {
      const file = await call(`/api/enquiries/${ref}`, { cookie: specA })
      expect(file.body.messages.map((m: { kind: string }) => m.kind)).not.toContain('note')
      expect(JSON.stringify(file.body)).not.toContain('terrain II?')
      expect(file.body.events).toEqual([])
      expect(file.body.enquiry.requester.email).toBeUndefined()
    })

    it('moves the enquiry back to "in hand" when the requester replies, with a drawing', async () => {
      const res = await callForm(`/api/enquiries/${ref}/messages`, form({ body: 'Elevation attached; parapet at 16.2 m.' }, [{ name: 'elevation.png', bytes: tinyPng }], 'files'), { cookie: specA })
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      expect(res.body.status).toBe('in_hand')
      const file = await call(`/api/enquiries/${ref}`, { cookie: officer })
      expect(file.body.messages.at(-1)).toMatchObject({ kind: 'requester', authorName: 'Orla Halloran' })
      expect(file.body.attachments.at(-1).fileName).toBe('elevation.png')
    })

    it('refuses a status change the life of an enquiry does not allow, and writes nothing', async () => {
      const [{ n: before }] = await testDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM enquiry_events', { type: QueryTypes.SELECT }) as [{ n: number }]
      const res = await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'received' } })
      expect(res.status).toBe(409)
      expect(res.body.message).toMatch(/cannot become "Received"/)
      expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'finished' } })).status).toBe(400)
      const [{ n: after }] = await testDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM enquiry_events', { type: QueryTypes.SELECT }) as [{ n: number }]
      expect(Number(after)).toBe(Number(before))
    })

    it('lets a specifier neither change status nor read another organisation\'s enquiry', async () => {
      expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: specA, body: { status: 'closed' } })).status).toBe(403)
      expect((await call(`/api/enquiries/${ref}`, { cookie: specB })).status).toBe(404)
      expect((await call(`/api/enquiries/${ref}/messages`, { cookie: specB, body: { body: 'Let me in' } })).status).toBe(404)
    })

    it('merges a duplicate into the original: thread moved, duplicate closed and pointing to it', async () => {
      const dup = (await call('/api/enquiries', { body: intake({ subject: 'Anchors at the parapet (again)', topic: 'wind' }), cookie: specA })).body.ref
      const res = await call(`/api/enquiries/${dup}/merge`, { cookie: officer, body: { intoRef: ref } })
      expect(res.status).toBe(200)
      const merged = await call(`/api/enquiries/${dup}`, { cookie: officer })
      expect(merged.body.enquiry).toMatchObject({ status: 'closed', mergedInto: ref })
      const original = await call(`/api/enquiries/${ref}`, { cookie: officer })
      expect(original.body.messages.some((m: { body: string }) => m.body.includes(`Merged from ${dup}`))).toBe(true)
      expect((await call(`/api/enquiries/${dup}/merge`, { cookie: officer, body: { intoRef: dup } })).status).toBe(400)
    })

    it('sanitises markdown: a script in the question never reaches the page', async () => {
      const hostile = await call('/api/enquiries', { body: intake({ question: 'Hello <script>alert(1)</script> and [link](javascript:alert(2)) <img src=x onerror=alert(3)>' }), cookie: specA })
      const file = await call(`/api/enquiries/${hostile.body.ref}`, { cookie: specA })
      expect(file.body.enquiry.questionHtml).not.toMatch(/<script|javascript:|onerror/i)
    })
  })

  describe('service targets', () => {
    it('lets a manager change them (officers may not), and the open enquiries follow', async () => {
      const targets = { targets: [{ priority: 'urgent', firstResponseMinutes: 120, answerMinutes: 240 }] }
      expect((await call('/api/desk/targets', { method: 'PUT', cookie: officer, body: targets })).status).toBe(403)
      const res = await call('/api/desk/targets', { method: 'PUT', cookie: manager, body: targets })
      expect(res.status).toBe(200)
      expect(res.body.recomputed).toBeGreaterThanOrEqual(0)
      const read = await call('/api/desk/targets', { cookie: officer })
      expect(read.body.targets.find((t: { priority: string }) => t.priority === 'urgent')).toMatchObject({ firstResponseMinutes: 120 })
      const bad = await call('/api/desk/targets', { method: 'PUT', cookie: manager, body: { targets: [{ priority: 'urgent', firstResponseMinutes: 300, answerMinutes: 240 }] } })
      expect(bad.status).toBe(400)
    })
  })
})
