import type { H3Event } from 'h3'

export interface RateLimitOptions {
  /** Separate counters per bucket, so one public method running hot does not lock out another. */
  bucket: string
  limit?: number
  windowMs?: number
}

interface Window {
  startedAt: number
  count: number
}

// In this process's memory: each server instance counts on its own, and a restart forgets every count. Behind a
// load balancer with N instances a client may make up to N × limit calls per window; the limit is there to stop
// one script hammering the public calculators, not to meter use.
const windows = new Map<string, Window>()
let lastSweep = 0

function sweep(now: number, windowMs: number) {
  if (now - lastSweep < windowMs) return
  lastSweep = now
  for (const [key, w] of windows) if (now - w.startedAt >= windowMs) windows.delete(key)
}

/**
 * Fixed-window limit per client address (default 60 calls a minute). Over the limit it answers 429 with
 * Retry-After (seconds to the end of the window) and a message saying when to try again.
 */
export function rateLimit(event: H3Event, { bucket, limit = 60, windowMs = 60_000 }: RateLimitOptions) {
  const now = Date.now()
  sweep(now, windowMs)
  const key = `${bucket}\u0000${clientAddress(event)}`
  let w = windows.get(key)
  if (!w || now - w.startedAt >= windowMs) {
    w = { startedAt: now, count: 0 }
    windows.set(key, w)
  }
  w.count++
  const resetIn = Math.max(1, Math.ceil((w.startedAt + windowMs - now) / 1000))
  setResponseHeader(event, 'RateLimit-Limit', String(limit))
  setResponseHeader(event, 'RateLimit-Remaining', String(Math.max(0, limit - w.count)))
  setResponseHeader(event, 'RateLimit-Reset', String(resetIn))
  if (w.count > limit) {
    setResponseHeader(event, 'Retry-After', resetIn)
    throw createError({
      statusCode: 429,
      statusMessage: 'Too many calculations',
      message: `This calculator takes ${limit} calculations a minute from one address. Try again in ${resetIn} second${resetIn === 1 ? '' : 's'}.`,
      data: { retryAfterSeconds: resetIn },
    })
  }
}
