import { open } from 'node:fs/promises'
import { fileTypeFromFile } from 'file-type'
import type { AcceptedFileType } from '../../shared/types/enquiry'

const contentTypes: Record<AcceptedFileType, string> = {
  pdf: 'application/pdf',
  png: 'image/png',
  jpg: 'image/jpeg',
  webp: 'image/webp',
  dwg: 'image/vnd.dwg',
  dxf: 'image/vnd.dxf',
  ifc: 'application/x-step',
  zip: 'application/zip',
}

async function head(path: string, bytes = 4096): Promise<Buffer> {
  const handle = await open(path, 'r')
  try {
    const buffer = Buffer.alloc(bytes)
    const { bytesRead } = await handle.read(buffer, 0, bytes, 0)
    return buffer.subarray(0, bytesRead)
  }
  finally {
    await handle.close()
  }
}

/**
 * What a file really is, from its bytes: binary formats by their signatures (file-type), AutoCAD DWG by its
 * "AC10xx" version header, and the text formats by their opening lines — DXF starts with group code 0 and
 * SECTION (after optional 999 comments), IFC is an ISO 10303-21 (STEP) file. Anything else is refused.
 */
export async function detectFileType(path: string): Promise<{ type: AcceptedFileType, contentType: string } | null> {
  const bytes = await head(path)
  const text = bytes.toString('latin1')
  let type: AcceptedFileType | null = null
  if (/^AC10(1[0-9]|2[0-9]|3[0-9])/.test(text)) type = 'dwg'
  else if (/^\uFEFF?\s*ISO-10303-21;/.test(text)) type = 'ifc'
  else if (/^\uFEFF?(\s*999\r?\n[^\r\n]*\r?\n)*\s*0\r?\n\s*SECTION\r?\n/.test(text)) type = 'dxf'
  else {
    const found = await fileTypeFromFile(path)
    // Office documents and other zip containers report their own type; only a plain zip is accepted.
    if (found && (['pdf', 'png', 'jpg', 'webp', 'zip'] as string[]).includes(found.ext)) type = found.ext as AcceptedFileType
  }
  return type ? { type, contentType: contentTypes[type] } : null
}

/**
 * A file name safe to show and to offer as a download: no directories, no control or markup characters,
 * no leading dots, at most 150 characters, the extension of the detected type.
 */
export function safeFileName(original: string | null | undefined, type: AcceptedFileType): string {
  const base = (original ?? '').split(/[\\/]/).pop() ?? ''
  const stem = base
    .replace(/\.[^.]*$/, '')
    .normalize('NFKC')
    .replace(/[^\p{L}\p{N} ._()-]+/gu, '_')
    .replace(/^[.\s_]+/, '')
    .trim()
    .slice(0, 140) || 'drawing'
  return `${stem}.${type === 'jpg' ? 'jpg' : type}`
}
