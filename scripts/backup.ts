// One archive holding everything Perpend keeps: a dump of its MariaDB database and the upload store.
//   tsx scripts/backup.ts [--out <folder>]        (npm run db:backup; default folder $PERPEND_VAR/backups)
// Reads the database from NUXT_DB_* and the store from NUXT_UPLOAD_DIR, like the server. Writes
// perpend-<UTC time>.tar.gz with database.sql, uploads/ and manifest.json (row counts, every file's SHA-256),
// and prints its path. Safe while the app runs: the dump is one consistent snapshot, and it is taken before
// the files are copied; stored files never change once written and a record is committed only after its
// file is stored, so every file a dumped record names is already in the store when the copy starts.
import { mkdir, mkdtemp, rename, rm, writeFile, cp, stat } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import { readFileSync } from 'node:fs'
import { dbOptionsFromEnv } from '../server/database/connect'
import { hashTree, mariadbProgram, MANIFEST_FORMAT, rowCounts, sha256File, tar } from './backup-archive'
import type { Manifest } from './backup-archive'

const root = new URL('..', import.meta.url).pathname
const outArg = process.argv.indexOf('--out')
const outDir = resolve(outArg > 0 ? process.argv[outArg + 1]! : join(process.env.PERPEND_VAR || join(root, 'var'), 'backups'))
const uploadDir = resolve(process.env.NUXT_UPLOAD_DIR || join(root, 'var', 'uploads'))
const db = dbOptionsFromEnv()

const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z')
await mkdir(outDir, { recursive: true })
const work = await mkdtemp(join(outDir, `.perpend-${stamp}-`))
try {
  const counts = await rowCounts(db)
  const dumpPath = join(work, 'database.sql')
  await mariadbProgram('mariadb-dump', db, [
    '--single-transaction', '--quick', '--hex-blob', '--triggers', '--no-tablespaces',
    '--default-character-set=utf8mb4', db.name,
  ], { stdout: dumpPath })

  const copied = join(work, 'uploads')
  await mkdir(copied)
  if (await stat(uploadDir).catch(() => null)) {
    await cp(uploadDir, copied, { recursive: true, filter: src => !src.startsWith(join(uploadDir, '.incoming')) })
  }
  const files = await hashTree(copied)
  const manifest: Manifest = {
    format: MANIFEST_FORMAT,
    createdAt: new Date().toISOString(),
    appVersion: (JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string }).version,
    database: {
      name: db.name,
      dump: { path: 'database.sql', bytes: (await stat(dumpPath)).size, sha256: await sha256File(dumpPath) },
      rowCounts: counts,
    },
    uploads: { files: files.length, bytes: files.reduce((s, f) => s + f.bytes, 0), list: files },
  }
  await writeFile(join(work, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`)

  const archive = join(outDir, `perpend-${stamp}.tar.gz`)
  // Written under a temporary name first, so a half-written archive never carries the real one's name.
  await tar(['-czf', `${archive}.partial`, '-C', work, 'manifest.json', 'database.sql', 'uploads'])
  await rename(`${archive}.partial`, archive)
  const enquiries = counts.enquiries ?? 0
  console.log(`Backed up ${db.name} (${enquiries} enquiries, ${Object.keys(counts).length} tables) and ${files.length} stored file(s) to`)
  console.log(archive)
}
finally {
  await rm(work, { recursive: true, force: true })
}
