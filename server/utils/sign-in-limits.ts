import type { H3Event } from 'h3'
import { fn, col, Op } from 'sequelize'
import { SignInAttempt } from '../models'

/** Failed sign-ins allowed in the window before that account, or that address, is locked out for a while. */
export const SIGN_IN_WINDOW_MS = 15 * 60_000
export const FAILURES_PER_ACCOUNT = 10
// An office behind one address has several people; the per-address limit is wider than the per-account one.
export const FAILURES_PER_ADDRESS = 30

async function lockedUntil(where: { email?: string, ip?: string }, limit: number): Promise<Date | null> {
  const since = new Date(Date.now() - SIGN_IN_WINDOW_MS)
  const failures = await SignInAttempt.findAll({
    attributes: ['createdAt'],
    where: { ...where, succeeded: false, createdAt: { [Op.gte]: since } },
    order: [['createdAt', 'DESC']],
    limit,
  })
  if (failures.length < limit) return null
  // Locked until the oldest of the last `limit` failures leaves the window.
  const oldest = failures[failures.length - 1]!.createdAt
  return new Date(oldest.getTime() + SIGN_IN_WINDOW_MS)
}

/** Throws 429 with a time to try again when the account or the address has failed too often. */
export async function assertNotLockedOut(event: H3Event, email: string, ip: string) {
  const [byAccount, byAddress] = await Promise.all([
    lockedUntil({ email }, FAILURES_PER_ACCOUNT),
    lockedUntil({ ip }, FAILURES_PER_ADDRESS),
  ])
  const until = [byAccount, byAddress].filter((d): d is Date => !!d).sort((a, b) => b.getTime() - a.getTime())[0]
  if (!until) return
  const seconds = Math.max(1, Math.ceil((until.getTime() - Date.now()) / 1000))
  setResponseHeader(event, 'Retry-After', seconds)
  const minutes = Math.ceil(seconds / 60)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too many sign-in attempts',
    message: `Too many failed sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'} (after ${until.toISOString().slice(11, 16)} UTC).`,
    data: { retryAt: until.toISOString() },
  })
}

export async function recordAttempt(email: string, ip: string, succeeded: boolean) {
  await SignInAttempt.create({ email, ip, succeeded })
}

/** Used by the tests' clean-up and by admins: how many failures an account has in the current window. */
export async function recentFailures(email: string): Promise<number> {
  const row = await SignInAttempt.findOne({
    attributes: [[fn('COUNT', col('id')), 'n']],
    where: { email, succeeded: false, createdAt: { [Op.gte]: new Date(Date.now() - SIGN_IN_WINDOW_MS) } },
    raw: true,
  }) as unknown as { n: number } | null
  return Number(row?.n ?? 0)
}
