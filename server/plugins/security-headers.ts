import { randomBytes } from 'node:crypto'
import type { TLSSocket } from 'node:tls'
import type { H3Event } from 'h3'

/**
 * Security headers on every response, set in the request hook so that static files and error answers carry
 * them too. Pages get a Content-Security-Policy with a fresh nonce, added to the inline scripts and styles
 * Nuxt itself writes into the page head and body end (never to the rendered app, where requesters' text is):
 * a script that someone smuggles into a page has no nonce and does not run. No 'unsafe-eval' anywhere.
 */

// Worker scripts take their policy from their own response, so /_nuxt/ files carry none: pdf.js's worker
// (loaded from /_nuxt/, allowed by worker-src) decodes some images with WebAssembly.
const BUILD_ASSETS = '/_nuxt/'

function pagePolicy(nonce: string, path: string): string {
  // The dev mailbox shows caught HTML mail in a sandboxed srcdoc frame, which inherits this policy; mail
  // styles itself inline. The page is off outside the demo.
  const style = path.startsWith('/dev/mailbox') ? `'self' 'unsafe-inline'` : `'self' 'nonce-${nonce}'`
  return [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}'`,
    `style-src ${style}`,
    `img-src 'self' data: blob:`,
    `font-src 'self' data:`,
    `connect-src 'self'`,
    `worker-src 'self' blob:`,
    `frame-src 'self'`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ')
}

// JSON, CSV, PDFs and drawings: nothing in them should load or run anything, nor be framed elsewhere. Routes
// that serve uploaded files set a stricter policy of their own (sandbox).
const API_POLICY = `default-src 'none'; img-src 'self' data:; style-src 'unsafe-inline'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'`

const COMMON_HEADERS = {
  'X-Content-Type-Options': 'nosniff',
  'X-Frame-Options': 'DENY',
  'Referrer-Policy': 'same-origin',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=(), usb=()',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Resource-Policy': 'same-origin',
}

/** True when the caller reached us over TLS: directly, or through a proxy we were told to trust. */
function arrivedOverTls(event: H3Event): boolean {
  if ((event.node.req.socket as TLSSocket).encrypted) return true
  if (String(useRuntimeConfig().trustProxy) !== 'true') return false
  const proto = getRequestHeader(event, 'x-forwarded-proto') ?? ''
  return proto.split(',')[0]!.trim().toLowerCase() === 'https'
}

const NONCE_TARGET = /<(script|style)\b(?![^>]*\snonce=)/g
const withNonce = (chunk: string, nonce: string) => chunk.replace(NONCE_TARGET, `<$1 nonce="${nonce}"`)

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    setResponseHeaders(event, COMMON_HEADERS)
    // Browsers ignore HSTS over plain HTTP; sending it only over TLS keeps local http://127.0.0.1 honest.
    if (arrivedOverTls(event)) setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000; includeSubDomains')
    const path = event.path
    if (path.startsWith(BUILD_ASSETS)) return
    if (path.startsWith('/api/')) {
      setResponseHeader(event, 'Content-Security-Policy', API_POLICY)
      return
    }
    const nonce = randomBytes(16).toString('base64')
    event.context.cspNonce = nonce
    setResponseHeader(event, 'Content-Security-Policy', pagePolicy(nonce, path))
  })

  nitroApp.hooks.hook('render:html', (html, { event }) => {
    const nonce = event.context.cspNonce as string | undefined
    if (!nonce) return
    html.head = html.head.map(chunk => withNonce(chunk, nonce))
    html.bodyAppend = html.bodyAppend.map(chunk => withNonce(chunk, nonce))
  })

  nitroApp.hooks.hook('render:response', (response) => {
    // Which framework serves the site is nobody's business.
    if (response.headers) delete response.headers['x-powered-by']
  })
})
