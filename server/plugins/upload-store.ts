import { resolve } from 'node:path'
import fsDriver from 'unstorage/drivers/fs'

/**
 * Mounts the upload store at run time from NUXT_UPLOAD_DIR (the filesystem by default; an S3-compatible
 * unstorage driver can be mounted here instead for several servers).
 */
export default defineNitroPlugin(() => {
  useStorage().mount('uploads', fsDriver({ base: resolve(useRuntimeConfig().uploadDir), ignore: ['.incoming/**'] }))
})
