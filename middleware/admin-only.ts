export default defineNuxtRouteMiddleware(() => {
  const { data } = useAuth()
  if ((data.value?.user as { role?: string } | undefined)?.role !== 'admin') return navigateTo('/')
})
