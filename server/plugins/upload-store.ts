import { readdir, rm, stat } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import { QueryTypes } from 'sequelize'
import fsDriver from 'unstorage/drivers/fs'

const STALE_MS = 60 * 60_000

/**
 * Mounts the upload store at run time from NUXT_UPLOAD_DIR (the filesystem by default; an S3-compatible
 * unstorage driver can be mounted here instead for several servers), then sweeps what a server killed
 * mid-upload may have left, at start-up and every hour after:
 * - temporary folders of a process on this host that is no longer running (the folder names its owner),
 *   at once; any other temporary folder once it is an hour old;
 * - stored files that no record names, once they are an hour old, so that a file stored by another
 *   instance whose transaction has not committed yet is never touched.
 * Instances sharing one upload folder must therefore have distinct host names (machines and containers do).
 */
export default defineNitroPlugin((nitroApp) => {
  const base = resolve(useRuntimeConfig().uploadDir)
  useStorage().mount('uploads', fsDriver({ base, ignore: ['.incoming/**'] }))
  if (import.meta.prerender) return
  const sweep = () => { void sweepUploads(base).catch(error => console.error('[uploads] sweep failed:', (error as Error).message)) }
  setTimeout(sweep, 2_000).unref()
  const hourly = setInterval(sweep, STALE_MS)
  hourly.unref()
  nitroApp.hooks.hook('close', () => clearInterval(hourly))
})

function processRunning(pid: number): boolean {
  try {
    process.kill(pid, 0)
    return true
  }
  catch (error) {
    // EPERM: it exists but belongs to someone else.
    return (error as NodeJS.ErrnoException).code === 'EPERM'
  }
}

/** Whether a temporary upload folder can belong to no request still running. */
function abandoned(name: string, mtimeMs: number, now: number): boolean {
  const owner = incomingFolderOwner(name)
  const me = thisUploadProcess()
  if (owner && owner.host === me.host) {
    // The same process id with another start time is an earlier life of this server (a container restarted as pid 1).
    if (owner.pid === me.pid) return owner.startedAt !== me.startedAt
    if (!processRunning(owner.pid)) return true
  }
  return now - mtimeMs > STALE_MS
}

export async function sweepUploads(base: string): Promise<{ folders: number, files: number }> {
  const now = Date.now()
  let folders = 0
  const incoming = join(base, '.incoming')
  for (const name of await readdir(incoming).catch(() => [] as string[])) {
    const info = await stat(join(incoming, name)).catch(() => null)
    if (info && abandoned(name, info.mtimeMs, now)) {
      await rm(join(incoming, name), { recursive: true, force: true })
      folders++
    }
  }
  const store = useStorage('uploads')
  const keys = (await store.getKeys('drawings')).map(k => k.replace(/^uploads:/, ''))
  let files = 0
  const db = useDb()
  for (let i = 0; i < keys.length; i += 500) {
    const chunk = keys.slice(i, i + 500)
    const known = await db.query<{ storage_key: string }>('SELECT storage_key FROM attachments WHERE storage_key IN (:chunk)', { replacements: { chunk }, type: QueryTypes.SELECT })
    const named = new Set(known.map(k => k.storage_key))
    for (const key of chunk) {
      if (named.has(key)) continue
      const meta = await store.getMeta(key)
      const mtime = meta.mtime ? new Date(meta.mtime).getTime() : 0
      if (now - mtime > STALE_MS) {
        await store.removeItem(key)
        files++
      }
    }
  }
  if (folders || files) console.log(`[uploads] swept ${folders} unfinished upload folder(s) and ${files} file(s) without a record`)
  return { folders, files }
}
