// The SMTP server away while the product has mail to send: it waits in the outbox and goes out once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../scripts/mail-catcher'
import type { MailCatcher } from '../../scripts/mail-catcher'
import { postEnquiry, sleep, startChildServer, startPrivateDb, waitUntil } from '../support/instance'
import type { ChildServer, PrivateDb } from '../support/instance'

interface OutboxRow { status: string, attempts: number, last_error: string | null, sent_at: Date | null }

describe('the mail server down', () => {
  let db: PrivateDb
  let server: ChildServer
  let catcher: MailCatcher | null = null
  let port = 0

  beforeAll(async () => {
    db = await startPrivateDb()
    await db.prepare()
    // Take a port the catcher can come back on, then leave it closed: nothing is listening there.
    const first = await startMailCatcher({ port: 0 })
    port = first.port
    await first.close()
    server = await startChildServer({ ...db.env, NUXT_MAIL_URL: `smtp://127.0.0.1:${port}`, NUXT_MAIL_POLL_MS: '500', NUXT_UPLOAD_DIR: `${db.varDir}/uploads` })
  })
  afterAll(async () => {
    await catcher?.close()
    await server?.stop()
    await db?.destroy()
  })

  it('keeps the acknowledgement in the outbox with its failed attempts, and sends it exactly once when SMTP is back', async () => {
    const res = await postEnquiry(server.base, 'Mail outage probe')
    expect(res.status).toBe(201)
    const { ref } = await res.json() as { ref: string }
    const outbox = () => db.query<OutboxRow>(
      `SELECT m.status, m.attempts, m.last_error, m.sent_at FROM outbox_messages m JOIN enquiries e ON e.id = m.enquiry_id WHERE e.ref = ?`, [ref])

    // The first attempt follows the commit at once, the second after the 5 s backoff.
    const waiting = await waitUntil('two failed delivery attempts', async () => {
      const [row] = await outbox()
      return row && row.attempts >= 2 ? row : null
    }, 40_000)
    expect(waiting.status).toBe('pending')
    expect(waiting.sent_at).toBeNull()
    expect(waiting.last_error).toMatch(/ECONNREFUSED|connect/i)

    catcher = await startMailCatcher({ port })
    const mail = await catcher.waitFor(m => m.subject.startsWith(`${ref} received`), 60_000)
    expect(mail.envelopeTo).toEqual(['fionnuala@outage.example'])
    const [sent] = await waitUntil('the outbox row marked sent', async () => {
      const rows = await outbox()
      return rows[0]?.status === 'sent' ? rows : null
    }, 10_000)
    expect(sent!.sent_at).not.toBeNull()
    expect(sent!.attempts).toBeGreaterThanOrEqual(3)
    expect(sent!.last_error).toBeNull()

    // Several more polls of the worker: nothing is sent a second time.
    await sleep(3_000)
    expect(catcher.messages.filter(m => m.subject.startsWith(`${ref} received`))).toHaveLength(1)
    expect(catcher.messages).toHaveLength(1)
  })
})
