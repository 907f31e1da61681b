import { request } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { url } from '@nuxt/test-utils/e2e'
import { describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'

// Raw bytes as they came over the wire (fetch would decode them), with only the encoding we name.
function raw(path: string, acceptEncoding: string | null) {
  const target = new URL(url(path))
  return new Promise<{ status: number, headers: Record<string, string | string[] | undefined>, body: Buffer }>((resolve, reject) => {
    const req = request(target, { headers: acceptEncoding ? { 'accept-encoding': acceptEncoding } : {} }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', c => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
    })
    req.on('error', reject)
    req.end()
  })
}

describe('compressed responses', async () => {
  await useBuiltServer()

  it('sends a rendered page in brotli or gzip as the browser asks, and plain when it asks for neither', async () => {
    const plain = await raw('/library', null)
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.body.toString()).toContain('Detail library')

    const br = await raw('/library', 'gzip, deflate, br')
    expect(br.headers['content-encoding']).toBe('br')
    expect(br.headers.vary).toMatch(/accept-encoding/i)
    const page = brotliDecompressSync(br.body).toString()
    expect(page).toContain('Detail library')
    expect(br.body.length).toBeLessThan(page.length / 3)

    const gz = await raw('/library', 'gzip')
    expect(gz.headers['content-encoding']).toBe('gzip')
    expect(gunzipSync(gz.body).toString()).toContain('Detail library')

    // q=0 refuses a coding.
    expect((await raw('/library', 'br;q=0, gzip')).headers['content-encoding']).toBe('gzip')
  })

  it('serves the build\'s scripts precompressed', async () => {
    const page = (await raw('/library', null)).body.toString()
    const script = page.match(/<script[^>]+type="module" src="([^"]+)"/)?.[1]
    expect(script).toMatch(/^\/_nuxt\/.+\.js$/)
    const br = await raw(script!, 'br')
    expect(br.headers['content-encoding']).toBe('br')
    const plain = await raw(script!, null)
    expect(brotliDecompressSync(br.body).equals(plain.body)).toBe(true)
  })
})
