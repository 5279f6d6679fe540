import type { SessionUser } from '#shared/types/auth'

export interface Profile extends SessionUser {
  organisation: { id: number, name: string, kind: 'grower' | 'maker', isNursery: boolean, region: string | null, currency: string } | null
}

/**
 * The signed-in person's saved profile (fresh from the server, unlike the session's copy). Awaited,
 * so a page that shows it renders once it has arrived; a units change refreshes it by its key.
 */
export async function useProfile() {
  const { user } = useSessionUser()
  const { data: profile, pending, error, refresh } = await useFetch<Profile>('/api/me', { key: 'profile', immediate: Boolean(user.value), watch: [() => user.value?.id] })
  return { profile, pending, error, refresh }
}
