import type { H3Event } from 'h3'
import type { WhereOptions } from 'sequelize'
import { Op } from 'sequelize'
import { User } from '../models'
import type { Role } from '../../shared/types/roles'
import { staffRoles } from '../../shared/types/roles'

/**
 * Who may call what, decided on the server in this one file. Every route under server/api starts with one
 * of these calls (or `publicRoute`), so the access test can hold every route to its declared audience.
 */

export interface Caller {
  id: number
  name: string
  email: string
  role: Role
  organisationId: number | null
}

/** The signed-in person, re-read from the database so a deactivation or role change bites on the next request. */
export async function currentCaller(event: H3Event): Promise<Caller | null> {
  if (event.context.caller !== undefined) return event.context.caller as Caller | null
  // Reading a session creates one; without a session cookie there is nobody to look up, and no cookie to set.
  const cookieName = useRuntimeConfig().session?.name || 'nuxt-session'
  if (!getCookie(event, cookieName)) {
    event.context.caller = null
    return null
  }
  const session = await getUserSession(event)
  let caller: Caller | null = null
  if (session.user?.id) {
    useDb()
    const user = await User.findByPk(session.user.id)
    if (user && !user.deactivatedAt) {
      caller = { id: user.id, name: user.name, email: user.email, role: user.role, organisationId: user.organisationId ?? null }
    }
    else {
      await clearUserSession(event)
      forgetRequestCookie(event, cookieName)
    }
  }
  event.context.caller = caller
  return caller
}

/**
 * Clearing the session only sets an expired cookie on the response: anything later in this request that reads
 * the session (nuxt-auth-utils' session route, which the server-side render asks for the page header) would
 * unseal the request's cookie again and still see the person. Take the cookie out of the request as well.
 */
function forgetRequestCookie(event: H3Event, name: string) {
  const header = event.node.req.headers.cookie
  if (!header) return
  event.node.req.headers.cookie = header.split(';').filter(part => part.split('=')[0]!.trim() !== name).join(';')
}

/** Open to everyone, signed in or not. Resolves the caller when there is one. */
export async function publicRoute(event: H3Event): Promise<Caller | null> {
  return currentCaller(event)
}

export async function requireCaller(event: H3Event): Promise<Caller> {
  const caller = await currentCaller(event)
  if (!caller) throw createError({ statusCode: 401, statusMessage: 'Please sign in to continue' })
  return caller
}

export async function requireRole(event: H3Event, allowed: readonly Role[]): Promise<Caller> {
  const caller = await requireCaller(event)
  if (!allowed.includes(caller.role)) throw createError({ statusCode: 403, statusMessage: 'Your account cannot do this' })
  return caller
}

export const requireStaff = (event: H3Event) => requireRole(event, staffRoles)
export const requireManager = (event: H3Event) => requireRole(event, ['manager', 'admin'])
export const requireAdmin = (event: H3Event) => requireRole(event, ['admin'])
export const requireSpecifier = (event: H3Event) => requireRole(event, ['specifier'])

export function isStaff(caller: Caller | null): boolean {
  return !!caller && staffRoles.includes(caller.role)
}

/**
 * The WHERE clause that limits enquiries to what the caller may see: staff see the desk, a specifier sees
 * their organisation's enquiries (and their own, should they have been filed before they joined it).
 */
export function enquiryScope(caller: Caller): WhereOptions {
  if (isStaff(caller)) return {}
  const own: WhereOptions[] = [{ requesterUserId: caller.id }]
  if (caller.organisationId) own.push({ organisationId: caller.organisationId })
  return { [Op.or]: own }
}

/** The same answer for "does not exist" and "not yours", so nobody can probe for other firms' records. */
export function notFound(what = 'record'): never {
  throw createError({ statusCode: 404, statusMessage: `No such ${what}` })
}
