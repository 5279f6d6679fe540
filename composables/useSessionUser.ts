import type { SessionUser } from '#shared/types/auth'

/** The signed-in person as the session carries them, or null. */
export function useSessionUser() {
  const { data, status } = useAuth()
  const user = computed(() => (status.value === 'authenticated' ? (data.value?.user as unknown as SessionUser) : null))
  return { user, status }
}
