import { decideAccess, type AccessRule } from '#shared/utils/access'

declare module '#app' {
  interface PageMeta {
    /** Who may open the page: its entry in PAGE_RULES. A page without one is guarded by sign-in alone. */
    access?: AccessRule
  }
}

// A person the page's rule turns away goes home. A signed-out visitor is left to the auth module's
// middleware, which runs after this one and sends them to sign in with the page as the way back.
export default defineNuxtRouteMiddleware((to) => {
  const rule = to.meta.access
  if (!rule) return
  const { user } = useSessionUser()
  const decision = decideAccess(user.value, rule)
  if (!decision.ok && decision.statusCode === 403) return navigateTo('/')
})
