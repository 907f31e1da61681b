/**
 * CSRF guard for cookie-authenticated writes: any request that can change something must come from a page
 * of this site. Browsers send Origin on every cross-site and same-site POST/PUT/PATCH/DELETE, so a write
 * whose Origin (or, failing that, Referer) is not this host is refused.
 */
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

export default defineEventHandler((event) => {
  if (SAFE.has(event.method)) return
  if (!event.path.startsWith('/api/')) return
  // The mail provider's inbound hook is no browser; it proves itself with its shared secret (requireInboundSecret).
  if (event.path.split('?')[0] === '/api/mail/inbound') return
  const host = getRequestHeader(event, 'x-forwarded-host') && String(useRuntimeConfig().trustProxy) === 'true'
    ? getRequestHeader(event, 'x-forwarded-host')
    : getRequestHeader(event, 'host')
  const origin = getRequestHeader(event, 'origin') ?? getRequestHeader(event, 'referer')
  let originHost: string | null
  try { originHost = origin ? new URL(origin).host : null }
  catch { originHost = null }
  if (!host || originHost !== host) {
    throw createError({ statusCode: 403, statusMessage: 'Cross-site request refused', message: 'This change must be made from a Perpend page. Reload the page and try again.' })
  }
})
