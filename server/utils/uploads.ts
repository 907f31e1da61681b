import { randomUUID } from 'node:crypto'
import { createReadStream } from 'node:fs'
import { mkdir, rm } from 'node:fs/promises'
import { hostname } from 'node:os'
import { join, resolve } from 'node:path'
import formidable, { errors as formidableErrors } from 'formidable'
import type { H3Event } from 'h3'
import { uploadLimits } from '../../shared/types/enquiry'
import type { AcceptedFileType } from '../../shared/types/enquiry'

export interface ReceivedFile {
  tmpPath: string
  fileName: string
  type: AcceptedFileType
  contentType: string
  sizeBytes: number
  sha256: string
}

export interface ReceivedForm {
  fields: Record<string, string>
  files: ReceivedFile[]
  /** Removes the request's temporary files; always call it (finally). */
  cleanup: () => Promise<void>
}

export function uploadRoot(): string {
  return resolve(useRuntimeConfig().uploadDir)
}

// Every temporary upload folder is named after the process receiving it, so that a server restarted after
// being killed mid-upload can tell its dead predecessor's leftovers from uploads still running elsewhere.
const owner = { host: hostname().replace(/[^\w.-]/g, '_'), pid: process.pid, startedAt: Date.now() }

export interface IncomingOwner { host: string, pid: number, startedAt: number }

export function incomingFolderName(): string {
  return `${owner.host}~${owner.pid}~${owner.startedAt}~${randomUUID()}`
}

/** Who made a temporary upload folder; null for a name this code did not make. */
export function incomingFolderOwner(name: string): IncomingOwner | null {
  const m = /^([\w.-]+)~(\d+)~(\d+)~[0-9a-f-]{36}$/.exec(name)
  return m ? { host: m[1]!, pid: Number(m[2]), startedAt: Number(m[3]) } : null
}

export const thisUploadProcess = (): IncomingOwner => ({ ...owner })

const tooLarge = (message: string) => createError({ statusCode: 413, statusMessage: 'Upload too large', message })

/**
 * Streams a multipart request to a temporary folder of its own (formidable hashes each file with SHA-256
 * as it arrives), then checks every file's real type from its bytes. On any failure the folder is removed,
 * so a refused or broken upload leaves nothing on disk.
 */
export async function receiveMultipart(event: H3Event, options: { fileField: string, alreadyStoredBytes?: number, alreadyStoredFiles?: number }): Promise<ReceivedForm> {
  if (!(getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported media type', message: 'Send the form as multipart/form-data.' })
  }
  const dir = join(uploadRoot(), '.incoming', incomingFolderName())
  await mkdir(dir, { recursive: true })
  const cleanup = () => rm(dir, { recursive: true, force: true })
  const maxFiles = uploadLimits.maxFiles - (options.alreadyStoredFiles ?? 0)
  const maxTotal = uploadLimits.maxTotalBytes - (options.alreadyStoredBytes ?? 0)
  try {
    const form = formidable({
      uploadDir: dir,
      maxFiles: Math.max(maxFiles, 0),
      maxFileSize: uploadLimits.maxFileBytes,
      maxTotalFileSize: Math.max(maxTotal, 1),
      maxFields: 50,
      maxFieldsSize: 1024 * 1024,
      allowEmptyFiles: false,
      minFileSize: 1,
      hashAlgorithm: 'sha256',
      filename: () => randomUUID(),
    })
    let parsed: [formidable.Fields, formidable.Files]
    try {
      parsed = await form.parse(event.node.req)
    }
    catch (error) {
      const code = (error as { code?: number }).code
      if (code === formidableErrors.biggerThanMaxFileSize) throw tooLarge(`Each file may be at most ${uploadLimits.maxFileBytes / 1024 / 1024} MB.`)
      if (code === formidableErrors.biggerThanTotalMaxFileSize) throw tooLarge(`All the files of one enquiry may add up to at most ${uploadLimits.maxTotalBytes / 1024 / 1024} MB.`)
      if (code === formidableErrors.maxFilesExceeded) throw createError({ statusCode: 400, statusMessage: 'Too many files', message: `An enquiry may carry at most ${uploadLimits.maxFiles} files.` })
      if (code === formidableErrors.smallerThanMinFileSize) throw createError({ statusCode: 400, statusMessage: 'Empty file', message: 'One of the files is empty.' })
      throw createError({ statusCode: 400, statusMessage: 'Bad upload', message: 'The upload could not be read. Please try again.' })
    }
    const [rawFields, rawFiles] = parsed
    const fields: Record<string, string> = {}
    for (const [key, value] of Object.entries(rawFields)) if (value?.[0] !== undefined) fields[key] = value[0]
    const files: ReceivedFile[] = []
    for (const [field, list] of Object.entries(rawFiles)) {
      if (field !== options.fileField) throw createError({ statusCode: 400, statusMessage: 'Bad upload', message: `Unexpected file field "${field.slice(0, 40)}".` })
      for (const file of list ?? []) {
        const detected = await detectFileType(file.filepath)
        const shownName = (file.originalFilename ?? 'file').slice(0, 120)
        if (!detected) {
          throw createError({ statusCode: 415, statusMessage: 'File type not accepted', message: `"${shownName}" is not a PDF, image (PNG, JPEG, WebP), DWG, DXF, IFC or ZIP file.` })
        }
        files.push({
          tmpPath: file.filepath,
          fileName: safeFileName(file.originalFilename, detected.type),
          type: detected.type,
          contentType: detected.contentType,
          sizeBytes: file.size,
          sha256: String(file.hash),
        })
      }
    }
    return { fields, files, cleanup }
  }
  catch (error) {
    await cleanup()
    throw error
  }
}

/** Storage keys of drawings: immutable, never derived from the uploaded name. */
export const newStorageKey = () => `drawings:${randomUUID()}`

/** Copies received files into the upload store (a stream per file); returns a function that takes them out again. */
export async function storeFiles(files: ReceivedFile[], keys: string[]): Promise<void> {
  const store = useStorage('uploads')
  for (let i = 0; i < files.length; i++) {
    // The fs driver hands the stream to fs.writeFile, so a 100 MB drawing is never held in memory.
    await store.setItemRaw(keys[i]!, createReadStream(files[i]!.tmpPath))
  }
}

export async function removeStored(keys: string[]): Promise<void> {
  const store = useStorage('uploads')
  await Promise.all(keys.map(k => store.removeItem(k).catch(() => {})))
}
