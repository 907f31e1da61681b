import type { Role } from '~~/shared/types/roles'

/**
 * Steers the UI only: sends people who are not signed in (or lack the page's role) to the right place.
 * Every API route checks access on the server regardless.
 */
export default defineNuxtRouteMiddleware(async (to) => {
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value) return navigateTo({ path: '/sign-in', query: { next: to.fullPath } })
  const roles = to.meta.roles as Role[] | undefined
  if (roles && user.value && !roles.includes(user.value.role)) return navigateTo('/')
})
