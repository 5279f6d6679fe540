// Orchard pages belong to grower organisations: makers and the platform admin go home instead.
export default defineNuxtRouteMiddleware(() => {
  const { data } = useAuth()
  if ((data.value?.user as { orgKind?: string | null } | undefined)?.orgKind !== 'grower') return navigateTo('/')
})
