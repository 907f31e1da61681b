import { createHash, timingSafeEqual } from 'node:crypto'
import type { H3Event } from 'h3'

/**
 * The mail provider's inbound hook is not a browser and has no session: it proves itself with the shared
 * secret in `x-perpend-inbound-secret` (NUXT_INBOUND_SECRET). Unset means the hook is off. Both sides are
 * hashed first so the comparison takes the same time whatever the length of the guess.
 */
export function requireInboundSecret(event: H3Event): void {
  const expected = String(useRuntimeConfig().inboundSecret ?? '')
  const given = getRequestHeader(event, 'x-perpend-inbound-secret') ?? ''
  const digest = (value: string) => createHash('sha256').update(value).digest()
  if (!expected || !timingSafeEqual(digest(given), digest(expected))) {
    throw createError({ statusCode: 401, statusMessage: 'Not authorised' })
  }
}
