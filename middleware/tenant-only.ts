// Pages about an organisation's own records: the platform admin has none, so goes home instead.
export default defineNuxtRouteMiddleware(() => {
  const { data } = useAuth()
  if ((data.value?.user as { role?: string } | undefined)?.role === 'admin') return navigateTo('/')
})
