// What the backup and restore scripts share: the archive's manifest, the MariaDB client programs run with
// the NUXT_DB_* settings, and SHA-256 over a folder of files.
import { spawn } from 'node:child_process'
import { createHash } from 'node:crypto'
import { closeSync, createReadStream, openSync } from 'node:fs'
import { readdir, stat } from 'node:fs/promises'
import { join, relative, sep } from 'node:path'
import * as mariadb from 'mariadb'
import type { DbOptions } from '../server/database/connect'

export const MANIFEST_FORMAT = 'perpend-backup/1'

export interface ManifestFile { path: string, bytes: number, sha256: string }

export interface Manifest {
  format: typeof MANIFEST_FORMAT
  createdAt: string
  appVersion: string
  database: {
    name: string
    dump: ManifestFile
    /** Rows per table, counted in one consistent snapshot just before the dump began. */
    rowCounts: Record<string, number>
  }
  /** The upload store (drawings, response packs, quotations, kept inbound mail), paths relative to it. */
  uploads: { files: number, bytes: number, list: ManifestFile[] }
}

export function sha256File(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256')
    createReadStream(path).on('data', c => hash.update(c)).on('error', reject).on('end', () => resolve(hash.digest('hex')))
  })
}

/** Every file under `dir` (the upload store's temporary folder for uploads in progress left out), hashed. */
export async function hashTree(dir: string): Promise<ManifestFile[]> {
  const entries = await readdir(dir, { recursive: true, withFileTypes: true }).catch(() => [])
  const files: ManifestFile[] = []
  for (const entry of entries) {
    if (!entry.isFile()) continue
    const full = join(entry.parentPath, entry.name)
    const path = relative(dir, full).split(sep).join('/')
    if (path.startsWith('.incoming/')) continue
    const { size } = await stat(full)
    files.push({ path, bytes: size, sha256: await sha256File(full) })
  }
  return files.sort((a, b) => a.path.localeCompare(b.path))
}

export function connect(options: DbOptions) {
  return mariadb.createConnection({ host: options.host, port: options.port, user: options.user, password: options.password, database: options.name, bigIntAsNumber: true })
}

/** Rows of every table of the database, read in one snapshot. */
export async function rowCounts(options: DbOptions): Promise<Record<string, number>> {
  const conn = await connect(options)
  try {
    await conn.query('START TRANSACTION WITH CONSISTENT SNAPSHOT')
    const tables = await conn.query<{ name: string }[]>(
      `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE' ORDER BY table_name`, [options.name])
    const counts: Record<string, number> = {}
    for (const { name } of tables) {
      const [row] = await conn.query<{ n: number }[]>(`SELECT COUNT(*) AS n FROM \`${name.replace(/`/g, '``')}\``)
      counts[name] = Number(row!.n)
    }
    await conn.query('COMMIT')
    return counts
  }
  finally {
    await conn.end()
  }
}

/**
 * Runs one of MariaDB's client programs against the instance. `--no-defaults` comes first (or /etc/mysql is
 * read); the password goes through MYSQL_PWD so it never shows in the process list.
 */
export function mariadbProgram(program: 'mariadb' | 'mariadb-dump', options: DbOptions, args: string[], files: { stdin?: string, stdout?: string } = {}): Promise<void> {
  // Files are handed to the program as descriptors: the dump never passes through this process's memory.
  const stdin = files.stdin ? openSync(files.stdin, 'r') : 'ignore'
  const stdout = files.stdout ? openSync(files.stdout, 'w', 0o600) : 'ignore'
  const close = () => {
    if (typeof stdin === 'number') closeSync(stdin)
    if (typeof stdout === 'number') closeSync(stdout)
  }
  return new Promise<void>((resolve, reject) => {
    const child = spawn(program, ['--no-defaults', `--host=${options.host}`, `--port=${options.port}`, `--user=${options.user}`, '--protocol=TCP', ...args], {
      env: { ...process.env, MYSQL_PWD: options.password },
      stdio: [stdin, stdout, 'pipe'],
    })
    let stderr = ''
    child.stderr!.on('data', (c: Buffer) => { stderr += c.toString() })
    child.on('error', reject)
    child.on('close', (code) => {
      if (code === 0) resolve()
      else reject(new Error(`${program} exited with ${code}: ${stderr.trim().slice(0, 2000)}`))
    })
  }).finally(close)
}

export function tar(args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn('tar', args, { stdio: ['ignore', 'ignore', 'pipe'] })
    let stderr = ''
    child.stderr!.on('data', (c: Buffer) => { stderr += c.toString() })
    child.on('error', reject)
    child.on('close', code => (code === 0 ? resolve() : reject(new Error(`tar exited with ${code}: ${stderr.trim()}`))))
  })
}
