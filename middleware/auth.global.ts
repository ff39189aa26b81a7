// Sends people without a session to sign-in (and back afterwards), and keeps each role out of the
// sections it does not see. Only the experience: every API route checks on the server itself.
import { isPublicPath, roleMaySee } from '~~/shared/access'
import type { RoleName } from '~~/shared/navigation'

declare module '#app' {
  interface PageMeta {
    /** Roles that may open the page; others are sent to the overview. */
    roles?: RoleName[]
  }
}

export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, session } = useUserSession()
  if (isPublicPath(to.path)) {
    if (to.path === '/sign-in' && loggedIn.value) return navigateTo('/overview')
    return
  }
  if (!loggedIn.value) return navigateTo({ path: '/sign-in', query: { next: to.fullPath } })
  const role = session.value?.role
  const pageRoles = to.meta.roles
  if (!roleMaySee(to.path, role) || (pageRoles && (!role || !pageRoles.includes(role)))) return navigateTo('/overview')
})
