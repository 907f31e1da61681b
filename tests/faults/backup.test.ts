// A backup of a running instance with uploaded drawings, restored into a fresh MariaDB instance and store:
// every enquiry and every file comes back, byte for byte, and the app serves them from the restored copy.
import { execFile } from 'node:child_process'
import { createHash } from 'node:crypto'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demo } from '../support/api'
import { dxfText, makePdf, tinyPng } from '../support/files'
import { anonymousEnquiry, signInAt, startChildServer, startPrivateDb } from '../support/instance'
import type { ChildServer, PrivateDb } from '../support/instance'
import { rootDir } from '../support/server'

const run = promisify(execFile)
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex')

interface EnquiryRow { ref: string, subject: string, status: string }
interface AttachmentRow { ref: string, id: number, storage_key: string, sha256: string, size_bytes: number }

describe('backup and restore', () => {
  let source: PrivateDb
  let target: PrivateDb | null = null
  let server: ChildServer
  let restoredServer: ChildServer | null = null
  const backups = mkdtempSync(join(tmpdir(), 'perpend-backups-'))

  beforeAll(async () => {
    source = await startPrivateDb('perpend_live')
    await source.prepare()
    server = await startChildServer({ ...source.env, NUXT_MAIL_URL: 'smtp://127.0.0.1:1', NUXT_UPLOAD_DIR: join(source.varDir, 'uploads') })
  })
  afterAll(async () => {
    await restoredServer?.stop()
    await server?.stop()
    await target?.destroy()
    await source?.destroy()
    rmSync(backups, { recursive: true, force: true })
  })

  const script = (name: string, db: PrivateDb, extra: string[] = []) => run('npx', ['tsx', `scripts/${name}.ts`, ...extra], {
    cwd: rootDir, env: { ...process.env, ...db.env, NUXT_UPLOAD_DIR: join(db.varDir, 'uploads') },
  })
  const enquiries = (db: PrivateDb) => db.query<EnquiryRow>('SELECT ref, subject, status FROM enquiries ORDER BY ref')
  const attachments = (db: PrivateDb) => db.query<AttachmentRow>(
    'SELECT e.ref, a.id, a.storage_key, a.sha256, a.size_bytes FROM attachments a JOIN enquiries e ON e.id = a.enquiry_id ORDER BY a.id')

  it('restores every enquiry and every stored file into a fresh instance, and refuses to restore over data', async () => {
    const drawings = [
      [{ name: 'ground-floor.pdf', bytes: await makePdf('Ground floor junction, plot 1') }, { name: 'site.png', bytes: tinyPng }],
      [{ name: 'eaves.pdf', bytes: await makePdf('Eaves detail, plot 4') }],
      [{ name: 'layout.dxf', bytes: Buffer.from(dxfText) }, { name: 'window-head.pdf', bytes: await makePdf('Window head, plot 6') }],
    ]
    for (const [i, files] of drawings.entries()) {
      const form = new FormData()
      form.append('data', JSON.stringify(anonymousEnquiry(`Backup drill ${i + 1}`)))
      for (const f of files) form.append('drawings', new Blob([new Uint8Array(f.bytes)]), f.name)
      const res = await fetch(`${server.base}/api/enquiries`, { method: 'POST', headers: { origin: server.base }, body: form })
      expect(res.status).toBe(201)
    }
    const liveEnquiries = await enquiries(source)
    const liveAttachments = await attachments(source)
    expect(liveEnquiries.length).toBe(9) // six of the demo data and three above
    expect(liveAttachments.length).toBe(5)

    // Taken while the server runs, as in production.
    const { stdout } = await script('backup', source, ['--out', backups])
    const archive = stdout.trim().split('\n').at(-1)!
    expect(archive).toMatch(/perpend-\d{8}T\d{6}Z\.tar\.gz$/)
    const { stdout: listing } = await run('tar', ['-tzf', archive])
    expect(listing).toMatch(/manifest\.json/)
    expect(listing).toMatch(/database\.sql/)
    await run('tar', ['-xzf', archive, '-C', backups, 'manifest.json'])
    const manifest = JSON.parse(readFileSync(join(backups, 'manifest.json'), 'utf8'))
    expect(manifest.database.rowCounts.enquiries).toBe(9)
    expect(manifest.database.rowCounts.attachments).toBe(5)
    expect(manifest.uploads.files).toBe(5)
    expect(manifest.uploads.list.map((f: { sha256: string }) => f.sha256).sort()).toEqual(liveAttachments.map(a => a.sha256).sort())

    target = await startPrivateDb('perpend_restored')
    await script('restore', target, [archive])

    expect(await enquiries(target)).toEqual(liveEnquiries)
    const restored = await attachments(target)
    expect(restored).toEqual(liveAttachments)
    const restoredStore = join(target.varDir, 'uploads')
    for (const a of restored) {
      const bytes = readFileSync(join(restoredStore, ...a.storage_key.split(':')))
      expect(sha256(bytes), a.storage_key).toBe(a.sha256)
      expect(bytes.length).toBe(a.size_bytes)
    }

    // The app runs on the restored copy: schema current, sign-in works, a drawing comes back byte for byte.
    restoredServer = await startChildServer({ ...target.env, NUXT_MAIL_URL: 'smtp://127.0.0.1:1', NUXT_UPLOAD_DIR: restoredStore })
    const health = await (await fetch(`${restoredServer.base}/api/health`)).json() as { status: string }
    expect(health.status).toBe('ok')
    const officer = await signInAt(restoredServer.base, demo.officer)
    const original = drawings.flat()
    for (const a of restored) {
      const res = await fetch(`${restoredServer.base}/api/enquiries/${a.ref}/attachments/${a.id}`, { headers: { cookie: officer } })
      expect(res.status).toBe(200)
      const bytes = Buffer.from(await res.arrayBuffer())
      expect(original.some(f => Buffer.from(f.bytes).equals(bytes)), `attachment ${a.id}`).toBe(true)
    }

    // A second restore over the now full instance is refused and changes nothing.
    const refused = await script('restore', target, [archive]).then(() => null, (error: { code: number, stderr: string }) => error)
    expect(refused?.code).toBe(3)
    expect(refused?.stderr).toMatch(/Not restoring: the database perpend_restored .* already has \d+ table\(s\) and the upload store .* is not empty\. .*--replace/)
    expect(await enquiries(target)).toEqual(liveEnquiries)
    // With --replace it goes through and the result is the same.
    await script('restore', target, [archive, '--replace'])
    expect(await attachments(target)).toEqual(liveAttachments)
  })
})
