import { readdir, rm, stat } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import { QueryTypes } from 'sequelize'
import fsDriver from 'unstorage/drivers/fs'

const STALE_MS = 60 * 60_000

/**
 * Mounts the upload store at run time from NUXT_UPLOAD_DIR (the filesystem by default; an S3-compatible
 * unstorage driver can be mounted here instead for several servers), then sweeps what a server killed
 * mid-upload may have left: temporary folders, and stored files that no attachment row names. Only things
 * older than an hour go, so uploads running on another instance are never touched.
 */
export default defineNitroPlugin(() => {
  const base = resolve(useRuntimeConfig().uploadDir)
  useStorage().mount('uploads', fsDriver({ base, ignore: ['.incoming/**'] }))
  if (import.meta.prerender) return
  setTimeout(() => { void sweepUploads(base).catch(error => console.error('[uploads] start-up sweep failed:', error)) }, 2_000).unref()
})

export async function sweepUploads(base: string): Promise<{ folders: number, files: number }> {
  const now = Date.now()
  let folders = 0
  const incoming = join(base, '.incoming')
  for (const name of await readdir(incoming).catch(() => [] as string[])) {
    const info = await stat(join(incoming, name)).catch(() => null)
    if (info && now - info.mtimeMs > STALE_MS) {
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
