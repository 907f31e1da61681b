// The server killed (kill -9) while a drawing is still streaming in: after a restart, no rows and no files
// of the cut-off upload remain, and the files of committed enquiries are untouched.
import { createHash, randomBytes } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { request } from 'node:http'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { makePdf } from '../support/files'
import { anonymousEnquiry, startChildServer, startPrivateDb, waitUntil } from '../support/instance'
import type { ChildServer, PrivateDb } from '../support/instance'

const list = (dir: string) => (existsSync(dir) ? readdirSync(dir) : [])

describe('a server killed mid-upload', () => {
  let db: PrivateDb
  let server: ChildServer
  let uploadDir = ''
  let env: Record<string, string> = {}

  beforeAll(async () => {
    db = await startPrivateDb()
    await db.prepare()
    uploadDir = join(db.varDir, 'uploads')
    env = { ...db.env, NUXT_MAIL_URL: 'smtp://127.0.0.1:1', NUXT_UPLOAD_DIR: uploadDir }
    server = await startChildServer(env)
  })
  afterAll(async () => {
    await server?.stop()
    await db?.destroy()
  })

  async function counts() {
    const [row] = await db.query<Record<string, number>>(`SELECT
      (SELECT COUNT(*) FROM enquiries) AS enquiries, (SELECT COUNT(*) FROM attachments) AS attachments,
      (SELECT COUNT(*) FROM outbox_messages) AS outbox, (SELECT COUNT(*) FROM enquiry_events) AS events,
      (SELECT COUNT(*) FROM projects) AS projects`)
    return row!
  }

  it('leaves nothing of the cut-off upload after the restart, and keeps the committed files', async () => {
    // One enquiry with a drawing committed before the fault.
    const committed = await makePdf('Committed drawing, plot 9')
    const form = new FormData()
    form.append('data', JSON.stringify(anonymousEnquiry('Committed before the crash')))
    form.append('drawings', new Blob([new Uint8Array(committed)], { type: 'application/pdf' }), 'plot9.pdf')
    const ok = await fetch(`${server.base}/api/enquiries`, { method: 'POST', headers: { origin: server.base }, body: form })
    expect(ok.status).toBe(201)
    const before = await counts()
    const storedBefore = list(join(uploadDir, 'drawings'))
    expect(storedBefore).toHaveLength(1)

    // A 40 MB drawing sent 64 KB at a time: the server is killed while formidable is writing it.
    const boundary = `----perpend${randomBytes(8).toString('hex')}`
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="data"\r\n\r\n${JSON.stringify(anonymousEnquiry('Cut off mid-upload'))}\r\n`
      + `--${boundary}\r\nContent-Disposition: form-data; name="drawings"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.7\n`)
    const tail = Buffer.from(`\r\n--${boundary}--\r\n`)
    const fileBytes = 40 * 1024 * 1024
    const req = request(`${server.base}/api/enquiries`, {
      method: 'POST',
      headers: { 'origin': server.base, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + fileBytes + tail.length) },
    })
    const cutOff = new Promise<string>((resolve) => {
      req.on('error', error => resolve((error as NodeJS.ErrnoException).code ?? error.message))
      req.on('response', res => resolve(`answered ${res.statusCode}`))
    })
    req.write(head)
    const chunk = Buffer.alloc(64 * 1024, 0x20)
    let sent = 0
    const pump = setInterval(() => {
      if (sent + chunk.length < fileBytes) {
        req.write(chunk)
        sent += chunk.length
      }
    }, 20)

    const incoming = join(uploadDir, '.incoming')
    // Wait until part of the file is on disk in the request's temporary folder.
    const partial = await waitUntil('part of the upload on disk', () => {
      for (const folder of list(incoming)) {
        for (const file of list(join(incoming, folder))) {
          if (statSync(join(incoming, folder, file)).size > 512 * 1024) return folder
        }
      }
      return null
    }, 30_000)
    await server.kill()
    clearInterval(pump)
    expect(await cutOff).toMatch(/ECONNRESET|EPIPE|socket hang up/)
    req.destroy()
    // The precondition of the test: the killed server did leave its temporary folder behind.
    expect(list(incoming)).toContain(partial)

    server = await startChildServer(env)
    // The sweep removes the folder and then logs it; wait for both, the log reaching us through a pipe.
    await waitUntil('the start-up sweep to remove the cut-off upload', () => list(incoming).length === 0 && /swept \d+ unfinished/.test(server.output()), 20_000)
    expect(server.output()).toMatch(/swept 1 unfinished upload folder/)

    expect(await counts()).toEqual(before)
    const [{ n: cutOffRows }] = await db.query<{ n: number }>(`SELECT COUNT(*) AS n FROM enquiries WHERE subject = 'Cut off mid-upload'`) as [{ n: number }]
    expect(cutOffRows).toBe(0)
    // The committed drawing is still there, byte for byte, and is the only stored file.
    expect(list(join(uploadDir, 'drawings'))).toEqual(storedBefore)
    const [attachment] = await db.query<{ storage_key: string, sha256: string }>('SELECT storage_key, sha256 FROM attachments')
    const bytes = readFileSync(join(uploadDir, ...attachment!.storage_key.split(':')))
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(attachment!.sha256)
    expect(bytes.equals(committed)).toBe(true)
  })
})
