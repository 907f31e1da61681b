import type { H3Event } from 'h3'

export interface RateLimitOptions {
  /** Separate counters per bucket, so one public method running hot does not lock out another. */
  bucket: string
  limit?: number
  windowMs?: number
  /** How the refusal names what is limited; the public calculators' wording when absent. */
  refusal?: { statusMessage: string, message: (limit: number, retryText: string) => string }
}

const calculatorRefusal = {
  statusMessage: 'Too many calculations',
  message: (limit: number, retryText: string) => `This calculator takes ${limit} calculations a minute from one address. Try again in ${retryText}.`,
}

const retryText = (seconds: number) => seconds <= 90
  ? `${seconds} second${seconds === 1 ? '' : 's'}`
  : `${Math.ceil(seconds / 60)} minutes`

interface Window {
  startedAt: number
  count: number
  windowMs: number
}

// In this process's memory: each server instance counts on its own, and a restart forgets every count. Behind a
// load balancer with N instances a client may make up to N × limit calls per window; the limit is there to stop
// one script hammering the public calculators or the account mails, not to meter use.
const windows = new Map<string, Window>()
let lastSweep = 0

// Buckets have windows of different lengths: each entry goes when its own window is over.
function sweep(now: number) {
  if (now - lastSweep < 60_000) return
  lastSweep = now
  for (const [key, w] of windows) if (now - w.startedAt >= w.windowMs) windows.delete(key)
}

/**
 * Fixed-window limit per client address (default 60 calls a minute). Over the limit it answers 429 with
 * Retry-After (seconds to the end of the window) and a message saying when to try again.
 * Also used by the account routes that send mail to any address typed in, so they cannot be used to flood one.
 */
export function rateLimit(event: H3Event, { bucket, limit = 60, windowMs = 60_000, refusal = calculatorRefusal }: RateLimitOptions) {
  const now = Date.now()
  sweep(now)
  const key = `${bucket}\u0000${clientAddress(event)}`
  let w = windows.get(key)
  if (!w || now - w.startedAt >= windowMs) {
    w = { startedAt: now, count: 0, windowMs }
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
      statusMessage: refusal.statusMessage,
      message: refusal.message(limit, retryText(resetIn)),
      data: { retryAfterSeconds: resetIn },
    })
  }
}

/** Mail to any address typed in: a few an hour from one address is plenty for people, and stops a flood. */
export const accountMailLimit = (bucket: string) => ({
  bucket,
  limit: 10,
  windowMs: 60 * 60_000,
  refusal: {
    statusMessage: 'Too many requests',
    message: (limit: number, retryText: string) => `This form can be sent ${limit} times an hour from one address. Try again in ${retryText}.`,
  },
})
