import { brotliCompressSync, constants, gzipSync } from 'node:zlib'

/**
 * Rendered pages go out compressed when the browser says it can take it: the library page is about 105 KB of
 * HTML (the listing and its payload), about 15 KB in brotli. Build assets are compressed once at build time
 * (`nitro.compressPublicAssets`); this is the same for the pages, which are rendered per request.
 * Quality 5 brotli takes about a millisecond for a page this size; smaller pages are not worth the work.
 */
const MIN_BYTES = 1024

function preferredEncoding(accepted: string): 'br' | 'gzip' | null {
  const offered = accepted.toLowerCase().split(',').map(part => part.trim().split(';'))
  const allows = (name: string) => offered.some(([coding, q]) => coding === name && !/^\s*q=0(\.0*)?\s*$/.test(q ?? ''))
  if (allows('br')) return 'br'
  if (allows('gzip')) return 'gzip'
  return null
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:response', (response, { event }) => {
    if (typeof response.body !== 'string' || Buffer.byteLength(response.body) < MIN_BYTES) return
    const headers = (response.headers ??= {})
    headers.vary = headers.vary ? `${headers.vary}, Accept-Encoding` : 'Accept-Encoding'
    const encoding = preferredEncoding(getRequestHeader(event, 'accept-encoding') ?? '')
    if (!encoding) return
    const raw = Buffer.from(response.body)
    response.body = encoding === 'br'
      ? brotliCompressSync(raw, { params: { [constants.BROTLI_PARAM_QUALITY]: 5, [constants.BROTLI_PARAM_SIZE_HINT]: raw.length } })
      : gzipSync(raw, { level: 6 })
    headers['content-encoding'] = encoding
  })
})
