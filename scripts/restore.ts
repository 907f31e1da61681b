// Puts a backup made by scripts/backup.ts back: the database named by NUXT_DB_* and the upload store at
// NUXT_UPLOAD_DIR.
//   tsx scripts/restore.ts <archive.tar.gz> [--replace]      (npm run db:restore -- <archive>)
// Refuses a database that already has tables, or a store that already has files, unless --replace is given
// (then the tables are dropped and the store emptied first). The archive is checked against its manifest
// before anything is touched, and the result afterwards: row counts, and every stored file a record names
// present with its recorded SHA-256.
import { existsSync } from 'node:fs'
import { cp, mkdir, mkdtemp, readFile, readdir, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { dbOptionsFromEnv } from '../server/database/connect'
import { connect, hashTree, mariadbProgram, MANIFEST_FORMAT, rowCounts, sha256File, tar } from './backup-archive'
import type { Manifest } from './backup-archive'

const root = new URL('..', import.meta.url).pathname
const args = process.argv.slice(2)
const replace = args.includes('--replace')
const archiveArg = args.find(a => !a.startsWith('--'))
const db = dbOptionsFromEnv()
const uploadDir = resolve(process.env.NUXT_UPLOAD_DIR || join(root, 'var', 'uploads'))

class Refusal extends Error {}

async function unpack(archive: string): Promise<{ dir: string, manifest: Manifest }> {
  const dir = await mkdtemp(join(tmpdir(), 'perpend-restore-'))
  await tar(['-xzf', archive, '-C', dir])
  const manifest = JSON.parse(await readFile(join(dir, 'manifest.json'), 'utf8')) as Manifest
  if (manifest.format !== MANIFEST_FORMAT) throw new Refusal(`${archive} is not a Perpend backup (format ${String(manifest.format)}).`)
  if (await sha256File(join(dir, 'database.sql')) !== manifest.database.dump.sha256) throw new Refusal('The database dump in the archive does not match its manifest: the archive is damaged.')
  const files = await hashTree(join(dir, 'uploads'))
  const expected = new Map(manifest.uploads.list.map(f => [f.path, f.sha256]))
  const damaged = files.filter(f => expected.get(f.path) !== f.sha256).map(f => f.path)
  const missing = manifest.uploads.list.filter(f => !files.some(g => g.path === f.path)).map(f => f.path)
  if (damaged.length || missing.length) throw new Refusal(`The archive's upload store does not match its manifest (${damaged.length} changed, ${missing.length} missing): the archive is damaged.`)
  return { dir, manifest }
}

async function existingTables(): Promise<string[]> {
  const conn = await connect(db)
  try {
    const rows = await conn.query<{ name: string }[]>(`SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ?`, [db.name])
    return rows.map(r => r.name)
  }
  finally {
    await conn.end()
  }
}

async function dropTables(tables: string[]) {
  const conn = await connect(db)
  try {
    await conn.query('SET FOREIGN_KEY_CHECKS = 0')
    for (const t of tables) await conn.query(`DROP TABLE IF EXISTS \`${t.replace(/`/g, '``')}\``)
  }
  finally {
    await conn.end()
  }
}

/** Every stored file a record names, with the SHA-256 the record holds when it has one. */
async function namedFiles(): Promise<{ key: string, sha256: string | null }[]> {
  const conn = await connect(db)
  try {
    const attachments = await conn.query<{ key: string, sha256: string }[]>('SELECT storage_key AS `key`, sha256 FROM attachments')
    const inbound = await conn.query<{ key: string }[]>('SELECT raw_key AS `key` FROM inbound_quarantine WHERE raw_key IS NOT NULL').catch(() => [])
    return [...attachments, ...inbound.map(r => ({ key: r.key, sha256: null }))]
  }
  finally {
    await conn.end()
  }
}

async function restore(archive: string) {
  const { dir, manifest } = await unpack(archive)
  try {
    const tables = await existingTables()
    const storeFiles = existsSync(uploadDir) ? (await readdir(uploadDir)).filter(n => n !== '.incoming') : []
    if (!replace && (tables.length || storeFiles.length)) {
      const what = [
        tables.length ? `the database ${db.name} on ${db.host}:${db.port} already has ${tables.length} table(s)` : '',
        storeFiles.length ? `the upload store ${uploadDir} is not empty` : '',
      ].filter(Boolean).join(' and ')
      throw new Refusal(`Not restoring: ${what}. Restoring would replace them; run again with --replace if that is what you want.`)
    }
    if (tables.length) await dropTables(tables)
    if (storeFiles.length) await Promise.all(storeFiles.map(n => rm(join(uploadDir, n), { recursive: true, force: true })))

    await mariadbProgram('mariadb', db, ['--default-character-set=utf8mb4', db.name], { stdin: join(dir, 'database.sql') })
    await mkdir(uploadDir, { recursive: true })
    await cp(join(dir, 'uploads'), uploadDir, { recursive: true })

    const counts = await rowCounts(db)
    const differing = Object.entries(manifest.database.rowCounts).filter(([t, n]) => counts[t] !== n).map(([t, n]) => `${t}: ${counts[t] ?? 'missing'} instead of ${n}`)
    const problems: string[] = []
    if (differing.length) problems.push(`row counts differ from the manifest (${differing.join('; ')})`)
    const stored = new Map((await hashTree(uploadDir)).map(f => [f.path, f.sha256]))
    const named = await namedFiles()
    const lost = named.filter(f => !stored.has(f.key.split(':').join('/')))
    const changed = named.filter(f => f.sha256 && stored.has(f.key.split(':').join('/')) && stored.get(f.key.split(':').join('/')) !== f.sha256)
    if (lost.length) problems.push(`${lost.length} file(s) named by a record are missing (first: ${lost[0]!.key})`)
    if (changed.length) problems.push(`${changed.length} file(s) differ from their recorded SHA-256 (first: ${changed[0]!.key})`)
    if (problems.length) throw new Error(`Restored, but the result is not whole: ${problems.join('; ')}.`)
    console.log(`Restored ${manifest.database.name} of ${manifest.createdAt} into ${db.name} on ${db.host}:${db.port}: ${counts.enquiries ?? 0} enquiries, ${named.length} stored file(s) checked, ${stored.size} file(s) in ${uploadDir}.`)
  }
  finally {
    await rm(dir, { recursive: true, force: true })
  }
}

if (!archiveArg) {
  console.error('usage: tsx scripts/restore.ts <perpend-backup.tar.gz> [--replace]')
  process.exit(2)
}
try {
  await restore(resolve(archiveArg))
}
catch (error) {
  console.error((error as Error).message)
  process.exit(error instanceof Refusal ? 3 : 1)
}
