import { createHash, randomBytes } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import net from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fetch } from '@nuxt/test-utils/e2e'
import nodemailer from 'nodemailer'
import type Mail from 'nodemailer/lib/mailer'
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import type { CaughtMail, MailCatcher } from '../../scripts/mail-catcher'
import { call, demo, signIn } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { fakeExe, makePdf, tinyPng } from '../support/files'
import { useBuiltServer } from '../support/server'

/** A port nobody listens on right now, for the app's inbound SMTP listener. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer()
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const port = (server.address() as net.AddressInfo).port
      server.close(() => resolve(port))
    })
  })
}

const mailboxDir = mkdtempSync(join(tmpdir(), 'perpend-mailbox-'))
let catcher: MailCatcher = await startMailCatcher({ port: 0, dir: mailboxDir })
const catcherPort = catcher.port
const inboundPort = await freePort()
const secret = `test-secret-${randomBytes(12).toString('hex')}`
const inbound = nodemailer.createTransport({ host: '127.0.0.1', port: inboundPort, secure: false, ignoreTLS: true })
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex')

async function rows<T extends object>(sql: string, replacements: unknown[] = []): Promise<T[]> {
  return testDb().query<T>(sql, { replacements, type: QueryTypes.SELECT })
}
async function count(sql: string, replacements: unknown[] = []): Promise<number> {
  const [row] = await rows<{ n: number }>(sql, replacements)
  return Number(row!.n)
}

/** Polls until the check passes (the outbox worker works in the background). */
async function eventually<T>(check: () => Promise<T | null | undefined | false>, timeoutMs = 15_000): Promise<T> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const value = await check()
    if (value) return value
    if (Date.now() > until) throw new Error(`condition not met within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 200))
  }
}

/** The catcher keeps structured headers (addresses) as JSON text; the reply address is the one with a token. */
function replyToOf(mail: CaughtMail): string {
  const found = /[\w.+-]+\+[0-9a-f]{32}@[\w.-]+/.exec(mail.headers['reply-to'] ?? '')
  if (!found) throw new Error(`no reply address in ${mail.headers['reply-to']}`)
  return found[0]
}

const intake = (subject: string) => ({
  project: { name: 'Glenmore Terrace', region: 'Cork', stage: 'tender' },
  topic: 'junctions',
  subject,
  question: 'How is the cavity closer detailed at the window head with 150 mm EPS on the 215 mm block?',
  priority: 'normal',
})

describe('e-mail in, the outbox and the development mailbox', async () => {
  await useBuiltServer({
    NUXT_MAIL_URL: `smtp://127.0.0.1:${catcherPort}`,
    NUXT_INBOUND_SMTP_PORT: String(inboundPort),
    NUXT_INBOUND_SECRET: secret,
    PERPEND_DEV_MAILBOX: '1',
    PERPEND_MAILBOX_DIR: mailboxDir,
  })
  let officer = ''
  let specA = ''
  let admin = ''
  beforeAll(async () => {
    [officer, specA, admin] = await Promise.all([signIn(demo.officer), signIn(demo.specA), signIn(demo.admin)])
  })
  afterAll(async () => {
    inbound.close()
    await catcher.close()
    await closeTestDb()
    rmSync(mailboxDir, { recursive: true, force: true })
  })

  /** A fresh enquiry of specifier A's that the officer answered and set waiting on the requester. */
  async function waitingEnquiry(subject: string) {
    const created = await call('/api/enquiries', { body: intake(subject), cookie: specA })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const ref = created.body.ref as string
    expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'in_hand' } })).status).toBe(200)
    expect((await call(`/api/enquiries/${ref}/messages`, { cookie: officer, body: { kind: 'reply', body: 'Could you send the window head section at 1:5?' } })).status).toBe(201)
    expect((await call(`/api/enquiries/${ref}`, { method: 'PATCH', cookie: officer, body: { status: 'waiting_on_requester' } })).status).toBe(200)
    const [row] = await rows<{ id: number, reply_token: string, message_id: string, subject: string }>(
      `SELECT e.id, e.reply_token, o.message_id, o.subject FROM enquiries e JOIN outbox_messages o ON o.enquiry_id = e.id AND o.kind = 'reply'
       WHERE e.ref = ? ORDER BY o.id DESC LIMIT 1`, [ref])
    return { ref, id: row!.id, replyTo: `desk+${row!.reply_token}@perpend.invalid`, messageId: row!.message_id, subject: row!.subject }
  }

  const file = (ref: string) => call(`/api/enquiries/${ref}`, { cookie: officer })
  const footprint = async (enquiryId: number) => ({
    messages: await count('SELECT COUNT(*) AS n FROM enquiry_messages WHERE enquiry_id = ?', [enquiryId]),
    attachments: await count('SELECT COUNT(*) AS n FROM attachments WHERE enquiry_id = ?', [enquiryId]),
  })
  const send = (mail: Mail.Options) => inbound.sendMail(mail)

  describe('answers by e-mail', () => {
    it('threads an answer onto its enquiry: quoted history stripped, the drawing stored, back to "in hand"', { timeout: 60_000 }, async () => {
      const e = await waitingEnquiry('Cavity closer at the window head, plot 7')
      // The answer goes to what the caught reply says: its Reply-To and Message-ID.
      const reply = await catcher.waitFor(m => m.subject.startsWith(`Re: ${e.ref}`), 45_000)
      expect(reply.text).toContain('Could you send the window head section')
      expect(replyToOf(reply)).toBe(e.replyTo)
      const messageId = reply.headers['message-id']!
      expect(messageId).toBe(e.messageId)
      await send({
        from: 'Orla Halloran <Architect@Hallorans.example>',
        to: replyToOf(reply),
        subject: `Re: ${reply.subject}`,
        inReplyTo: messageId,
        references: [messageId],
        text: [
          'Section attached. The head is a steel lintel with a 20 mm drip.',
          '',
          'Orla',
          '',
          `On Tue, 3 Mar 2026 at 10:12, Perpend technical desk <${e.replyTo}> wrote:`,
          '> Dear Orla Halloran,',
          '> Could you send the window head section at 1:5?',
        ].join('\r\n'),
        attachments: [{ filename: 'window-head.png', content: tinyPng, contentType: 'image/png' }],
      })
      const after = await file(e.ref)
      expect(after.body.enquiry.status).toBe('in_hand')
      const last = after.body.messages.at(-1)
      expect(last).toMatchObject({ kind: 'requester', source: 'email', authorName: 'Orla Halloran' })
      expect(last.body).toBe('Section attached. The head is a steel lintel with a 20 mm drip.\n\nOrla')
      const stored = after.body.attachments.filter((a: { messageId: number }) => a.messageId === last.id)
      expect(stored).toHaveLength(1)
      expect(stored[0]).toMatchObject({ fileName: 'window-head.png', fileType: 'png', sha256: sha256(tinyPng), internal: false })
      const download = await fetch(stored[0].url, { headers: { cookie: specA } })
      expect(Buffer.from(await download.arrayBuffer()).equals(tinyPng)).toBe(true)
      const moves = after.body.events.filter((ev: { kind: string }) => ev.kind === 'status').map((ev: { from: string, to: string }) => `${ev.from}→${ev.to}`)
      expect(moves.at(-1)).toBe('waiting_on_requester→in_hand')
      expect(after.body.events.at(-1).actor).toBe('Orla Halloran')
    })

    it('threads by In-Reply-To when the address carries no token, and strips an "Original Message" block', async () => {
      const e = await waitingEnquiry('Render bead at the reveal')
      await send({
        from: demo.specA,
        to: 'desk@perpend.invalid',
        subject: 'Re: render bead',
        inReplyTo: e.messageId,
        text: 'The reveal is 50 mm.\n\n-----Original Message-----\nFrom: Perpend technical desk\nSent: Tuesday\nCould you send…',
      })
      const after = await file(e.ref)
      expect(after.body.messages.at(-1)).toMatchObject({ kind: 'requester', source: 'email', body: 'The reveal is 50 mm.' })
      expect(after.body.enquiry.status).toBe('in_hand')
    })

    it('reopens an answered enquiry when the requester writes again', async () => {
      const e = await waitingEnquiry('Parapet coping fixings')
      expect((await call(`/api/enquiries/${e.ref}`, { method: 'PATCH', cookie: officer, body: { status: 'answered' } })).status).toBe(200)
      await send({ from: demo.specA, to: e.replyTo, subject: 'Re: coping', text: 'One more question on the coping.\n\nFrom: desk\nTo: Orla\nSubject: earlier\n\nold text' })
      const after = await file(e.ref)
      expect(after.body.enquiry.status).toBe('reopened')
      expect(after.body.messages.at(-1).body).toBe('One more question on the coping.')
    })

    it('keeps a disguised executable out, and says so in the message instead of dropping it silently', async () => {
      const e = await waitingEnquiry('Sill detail with the ETICS')
      const before = await footprint(e.id)
      await send({
        from: demo.specA,
        to: e.replyTo,
        subject: 'Re: sill',
        text: 'Drawing attached.',
        attachments: [
          { filename: 'sill-detail.pdf', content: fakeExe, contentType: 'application/pdf' },
          { filename: 'photo.png', content: tinyPng },
        ],
      })
      const after = await file(e.ref)
      const last = after.body.messages.at(-1)
      expect(last.kind).toBe('requester')
      expect(last.body).toMatch(/^Drawing attached\.\n\nAttachments not kept/)
      expect(last.body).toContain('"sill-detail.pdf": not a PDF, image')
      expect(await footprint(e.id)).toEqual({ messages: before.messages + 1, attachments: before.attachments + 1 })
      const kept = after.body.attachments.filter((a: { messageId: number }) => a.messageId === last.id)
      expect(kept.map((a: { fileName: string }) => a.fileName)).toEqual(['photo.png'])
    })

    it('holds a mail with a forged token: nothing on any enquiry, a row in quarantine', async () => {
      const enquiries = await count('SELECT COUNT(*) AS n FROM enquiries')
      const messages = await count('SELECT COUNT(*) AS n FROM enquiry_messages')
      const forged = randomBytes(16).toString('hex')
      await send({ from: demo.specA, to: `desk+${forged}@perpend.invalid`, subject: 'Guessing a thread', text: 'Let me in.' })
      expect(await count('SELECT COUNT(*) AS n FROM enquiries')).toBe(enquiries)
      expect(await count('SELECT COUNT(*) AS n FROM enquiry_messages')).toBe(messages)
      const [held] = await rows<{ reason: string, enquiry_id: number | null, status: string, from_address: string, to_addresses: string }>(
        'SELECT * FROM inbound_quarantine WHERE subject = ? ORDER BY id DESC LIMIT 1', ['Guessing a thread'])
      expect(held).toMatchObject({ reason: 'no-match', enquiry_id: null, status: 'held', from_address: demo.specA })
      expect(held!.to_addresses).toContain(forged)
    })

    it('holds an automatic reply without moving the enquiry', async () => {
      const e = await waitingEnquiry('Movement joint spacing')
      const before = await footprint(e.id)
      await send({ from: demo.specA, to: e.replyTo, subject: 'Out of office', text: 'I am away until Monday.', headers: { 'Auto-Submitted': 'auto-replied' } })
      expect(await footprint(e.id)).toEqual(before)
      expect((await file(e.ref)).body.enquiry.status).toBe('waiting_on_requester')
      expect(await count('SELECT COUNT(*) AS n FROM inbound_quarantine WHERE enquiry_id = ? AND reason = ?', [e.id, 'auto-reply'])).toBe(1)
    })

    it('holds a valid token from an unknown sender, and an officer attaches it, drawings and all', async () => {
      const e = await waitingEnquiry('Base of wall DPC and starter track')
      const before = await footprint(e.id)
      const pdf = await makePdf('Starter track, plot 4')
      // A real account, but of another organisation: not someone this enquiry knows.
      await send({ from: `Maeve Keane <${demo.specB}>`, to: e.replyTo, subject: 'Re: DPC', text: 'Our engineer\'s note on the starter track.', attachments: [{ filename: 'starter.pdf', content: pdf }] })
      expect(await footprint(e.id)).toEqual(before)
      const [held] = await rows<{ id: number, reason: string, enquiry_id: number }>('SELECT id, reason, enquiry_id FROM inbound_quarantine WHERE enquiry_id = ? ORDER BY id DESC LIMIT 1', [e.id])
      expect(held).toMatchObject({ reason: 'unknown-sender', enquiry_id: e.id })

      const list = await call('/api/desk/quarantine', { cookie: officer })
      expect(list.status).toBe(200)
      const shown = list.body.mails.find((m: { id: number }) => m.id === held!.id)
      expect(shown).toMatchObject({ reason: 'unknown-sender', fromAddress: demo.specB, enquiry: { ref: e.ref } })
      expect(shown.attachments).toEqual([{ name: 'starter.pdf', contentType: 'application/pdf', size: pdf.length }])
      expect((await call('/api/desk/quarantine', { cookie: specA })).status).toBe(403)
      expect((await call(`/api/desk/quarantine/${held!.id}`, { cookie: specA, body: { action: 'attach', ref: e.ref } })).status).toBe(403)
      expect((await call(`/api/desk/quarantine/${held!.id}`, { cookie: officer, body: { action: 'attach', ref: 'TQ-1999-9999' } })).status).toBe(404)

      const attached = await call(`/api/desk/quarantine/${held!.id}`, { cookie: officer, body: { action: 'attach', ref: e.ref } })
      expect(attached.status, JSON.stringify(attached.body)).toBe(200)
      expect(attached.body).toMatchObject({ status: 'released', ref: e.ref, stored: 1, refused: [] })
      const after = await file(e.ref)
      expect(after.body.messages.at(-1)).toMatchObject({ kind: 'requester', source: 'email', authorName: `Maeve Keane <${demo.specB}>`, body: 'Our engineer\'s note on the starter track.' })
      expect(after.body.attachments.at(-1)).toMatchObject({ fileName: 'starter.pdf', sha256: sha256(pdf) })
      expect(after.body.enquiry.status).toBe('in_hand')
      expect(after.body.events.at(-1)).toMatchObject({ kind: 'status', to: 'in_hand', actor: 'Niamh Brennan' })
      expect((await call(`/api/desk/quarantine/${held!.id}`, { cookie: officer, body: { action: 'attach', ref: e.ref } })).status).toBe(409)
      expect((await call(`/api/desk/quarantine/${held!.id}`, { cookie: officer, body: {} })).status).toBe(400)
    })

    it('lets an officer discard a held mail', async () => {
      await send({ from: 'stranger@nowhere.example', to: 'desk@perpend.invalid', subject: 'Cheap watches', text: 'Buy now.' })
      const [held] = await rows<{ id: number }>('SELECT id FROM inbound_quarantine WHERE subject = ? ORDER BY id DESC LIMIT 1', ['Cheap watches'])
      const res = await call(`/api/desk/quarantine/${held!.id}`, { cookie: officer, body: { action: 'discard' } })
      expect(res.body).toEqual({ id: held!.id, status: 'discarded' })
      const [row] = await rows<{ status: string, decided_by: number | null }>('SELECT status, decided_by FROM inbound_quarantine WHERE id = ?', [held!.id])
      expect(row!.status).toBe('discarded')
      expect(row!.decided_by).not.toBeNull()
    })

    it('refuses over SIZE before any data is sent (552)', async () => {
      const reply = await new Promise<string>((resolve, reject) => {
        const socket = net.connect(inboundPort, '127.0.0.1')
        let buffer = ''
        const steps = ['EHLO test.example\r\n', `MAIL FROM:<${demo.specA}> SIZE=${400 * 1024 * 1024}\r\n`]
        socket.on('data', (chunk) => {
          buffer += chunk.toString()
          if (!/(^|\n)\d{3} [^\n]*\r\n$/.test(buffer)) return
          const step = steps.shift()
          if (step) {
            buffer = ''
            socket.write(step)
          }
          else {
            socket.end('QUIT\r\n')
            resolve(buffer)
          }
        })
        socket.on('error', reject)
      })
      expect(reply).toMatch(/^552 /)
    })
  })

  describe('the provider\'s inbound hook', () => {
    const hook = (body: string, headers: Record<string, string>) => fetch('/api/mail/inbound', { method: 'POST', body, headers })

    it('refuses a missing or wrong secret with 401 and threads a raw message with the right one', async () => {
      const e = await waitingEnquiry('Fixings into the ring beam')
      const raw = [
        `From: Orla Halloran <${demo.specA}>`,
        `To: ${e.replyTo}`,
        'Subject: Re: ring beam',
        `Message-ID: <${randomBytes(8).toString('hex')}@hallorans.example>`,
        'Content-Type: text/plain; charset=utf-8',
        '',
        'The ring beam is C30/37.',
        '',
        '> Could you send the window head section at 1:5?',
        '',
      ].join('\r\n')
      const before = await footprint(e.id)
      expect((await hook(raw, { 'content-type': 'message/rfc822' })).status).toBe(401)
      expect((await hook(raw, { 'content-type': 'message/rfc822', 'x-perpend-inbound-secret': `${secret}x` })).status).toBe(401)
      expect((await hook(raw, { 'content-type': 'application/json', 'x-perpend-inbound-secret': secret })).status).toBe(415)
      expect(await footprint(e.id)).toEqual(before)
      const ok = await hook(raw, { 'content-type': 'message/rfc822', 'x-perpend-inbound-secret': secret })
      expect(ok.status).toBe(200)
      expect(await ok.json()).toMatchObject({ outcome: 'threaded', ref: e.ref, stored: 0 })
      const after = await file(e.ref)
      expect(after.body.messages.at(-1)).toMatchObject({ kind: 'requester', source: 'email', body: 'The ring beam is C30/37.' })
    })
  })

  describe('the outbox', () => {
    it('keeps mail while the mail server is down and delivers each message exactly once when it is back', { timeout: 120_000 }, async () => {
      const created = await call('/api/enquiries', { body: intake('Lintel bearing at the corner'), cookie: specA })
      const ref = created.body.ref as string
      await catcher.close()

      expect((await call(`/api/enquiries/${ref}/messages`, { cookie: officer, body: { kind: 'reply', body: 'The lintel bears 150 mm on each side.' } })).status).toBe(201)
      expect((await call(`/api/enquiries/${ref}/messages`, { cookie: officer, body: { kind: 'reply', body: 'And a padstone under the point load.' } })).status).toBe(201)
      type Row = { id: number, status: string, attempts: number, last_error: string | null, message_id: string }
      const outbox = () => rows<Row>('SELECT id, status, attempts, last_error, message_id FROM outbox_messages WHERE enquiry_id = (SELECT id FROM enquiries WHERE ref = ?) AND kind = ? ORDER BY id', [ref, 'reply'])
      const failing = await eventually(async () => {
        const list = await outbox()
        return list.length === 2 && list.every(r => r.status === 'pending' && r.attempts >= 1 && r.last_error) ? list : null
      })
      const [first, second] = failing as [Row, Row]

      const desk = await call(`/api/enquiries/${ref}/mail`, { cookie: officer })
      expect(desk.status).toBe(200)
      expect(desk.body.messages.filter((m: { kind: string }) => m.kind === 'reply').every((m: { lastError: string | null }) => m.lastError)).toBe(true)
      expect((await call(`/api/enquiries/${ref}/mail`, { cookie: specA })).status).toBe(403)
      const listed = await call('/api/admin/outbox?status=pending', { cookie: admin })
      expect(listed.body.messages.find((m: { id: number }) => m.id === first.id)).toMatchObject({ status: 'pending', enquiryRef: ref })
      expect((await call('/api/admin/outbox', { cookie: officer })).status).toBe(403)

      // The worker gives up after eight attempts; arranged here so the test does not wait half an hour.
      await testDb().query('UPDATE outbox_messages SET status = \'failed\' WHERE id = ?', { replacements: [second.id], type: QueryTypes.UPDATE })
      expect((await call(`/api/admin/outbox/${first.id}/retry`, { cookie: admin, body: {} })).status).toBe(409)

      catcher = await startMailCatcher({ port: catcherPort, dir: mailboxDir })
      // The first retry would come 5 s after the failure; bring it forward rather than wait.
      await testDb().query('UPDATE outbox_messages SET next_attempt_at = NOW(3) WHERE id = ?', { replacements: [first.id], type: QueryTypes.UPDATE })
      await catcher.waitFor(m => m.headers['message-id'] === first.message_id, 45_000)
      expect((await call(`/api/admin/outbox/${second.id}/retry`, { cookie: officer, body: {} })).status).toBe(403)
      const retried = await call(`/api/admin/outbox/${second.id}/retry`, { cookie: admin, body: {} })
      expect(retried.body).toEqual({ id: second.id, status: 'pending' })
      await catcher.waitFor(m => m.headers['message-id'] === second.message_id, 45_000)

      // Longer than the worker's poll interval: a second delivery would have shown by now.
      await new Promise(r => setTimeout(r, 4000))
      for (const row of [first, second]) expect(catcher.messages.filter(m => m.headers['message-id'] === row.message_id)).toHaveLength(1)
      const done = await outbox()
      expect(done.map(r => r.status)).toEqual(['sent', 'sent'])
      expect(done.map(r => r.last_error)).toEqual([null, null])
    })
  })

  describe('the development mailbox', () => {
    it('lists what the catcher caught, newest first, with the headers and attachment names', async () => {
      const res = await call('/api/dev/mailbox')
      expect(res.status).toBe(200)
      const times = res.body.mails.map((m: { receivedAt: string }) => Date.parse(m.receivedAt))
      expect(times).toEqual([...times].sort((a, b) => b - a))
      const reply = res.body.mails.find((m: { subject: string }) => m.subject.startsWith('Re: TQ-'))
      expect(reply.replyTo).toMatch(/\+[0-9a-f]{32}@/)
      expect(reply.messageId).toMatch(/^<.+@.+>$/)
      expect(reply.html).toContain('<')
      expect(reply.text).toContain('Dear Orla Halloran')
    })
  })
})
