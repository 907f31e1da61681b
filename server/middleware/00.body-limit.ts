import type { IncomingMessage } from 'node:http'

/**
 * Refuses request bodies over the route's limit (server/utils/request-limits.ts) before any route reads one:
 * h3 buffers a whole body in memory before parsing, and nothing else bounds it. A declared Content-Length
 * is checked at once; a chunked body is read here up to the limit and handed to h3 as its own cached raw body.
 */
const BODY_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
// h3's cache of the raw body (readRawBody reads it before touching the stream); registered, so stable.
const rawBodyKey = Symbol.for('h3RawBody')

export default defineEventHandler(async (event) => {
  if (!BODY_METHODS.has(event.method) || !event.path.startsWith('/api/')) return
  const limit = bodyLimitFor(event.path, getRequestHeader(event, 'content-type') ?? '')
  if (limit === null) return
  const declared = getRequestHeader(event, 'content-length')
  if (declared !== undefined) {
    if (Number(declared) > limit) throw bodyTooLarge(limit)
    return
  }
  if (!/\bchunked\b/i.test(getRequestHeader(event, 'transfer-encoding') ?? '')) return
  const body = await readAtMost(event.node.req, limit)
  ;(event.node.req as unknown as Record<symbol, unknown>)[rawBodyKey] = Promise.resolve(body)
})

function bodyTooLarge(limit: number) {
  const size = limit >= 1024 * 1024 ? `${limit / 1024 / 1024} MB` : `${Math.round(limit / 1024)} kB`
  return createError({ statusCode: 413, statusMessage: 'Request too large', message: `This request may carry at most ${size} of data.` })
}

function readAtMost(req: IncomingMessage, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > limit) {
        // Stop keeping what arrives; Node discards the rest of the body once the 413 is sent.
        req.off('data', onData)
        req.off('end', onEnd)
        reject(bodyTooLarge(limit))
        return
      }
      chunks.push(chunk)
    }
    const onEnd = () => resolve(Buffer.concat(chunks))
    req.on('data', onData)
    req.on('end', onEnd)
    req.once('error', reject)
  })
}
