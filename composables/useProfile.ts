import type { SessionUser } from '#shared/types/auth'

export interface Profile extends SessionUser {
  organisation: { id: number, name: string, kind: 'grower' | 'maker', isNursery: boolean, region: string | null, currency: string } | null
}

/** The signed-in person's saved profile (fresh from the server, unlike the session's copy). */
export function useProfile() {
  const { user } = useSessionUser()
  return useFetch<Profile>('/api/me', { key: 'profile', immediate: Boolean(user.value), watch: [() => user.value?.id] })
}
