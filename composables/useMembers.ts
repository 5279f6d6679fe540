import type { MemberRole } from '#shared/types/auth'
import { ACCESS_RULES } from '#shared/utils/access'

export interface MemberRow { id: number, email: string, name: string, role: MemberRole, createdAt: string }
export interface InvitationRow { id: number, email: string, role: MemberRole, expiresAt: string }

/**
 * The organisation's members and, for those who may manage them (owners), its open invitations and
 * the actions on them.
 */
export function useMembers() {
  const { can } = useAccess()
  const canManage = computed(() => can(ACCESS_RULES.manageMembers))
  const { data: memberList, error, refresh } = useFetch<{ items: MemberRow[], total: number }>('/api/members', { key: 'members', query: { limit: 200 } })
  const { data: invitationList, refresh: refreshInvitations } = useFetch<{ items: InvitationRow[], total: number }>('/api/invitations', { key: 'invitations', immediate: canManage.value })
  const { pending: busy, error: actionError, run } = useAction()

  async function act(request: () => Promise<unknown>) {
    if (await run(request)) await refreshNuxtData(canManage.value ? ['members', 'invitations'] : ['members'])
  }

  // Plain strings: the typed-route inference of $fetch is too deep for these template paths.
  const member = (id: number): string => `/api/members/${id}`
  const invitation = (id: number): string => `/api/invitations/${id}`

  return {
    canManage,
    members: computed(() => memberList.value?.items),
    invitations: computed(() => invitationList.value?.items ?? []),
    error,
    refresh,
    actionError,
    busy,
    changeRole: (id: number, role: MemberRole) => act(() => $fetch<null>(member(id), { method: 'PATCH', body: { role } })),
    remove: (id: number) => act(() => $fetch<null>(member(id), { method: 'DELETE' })),
    revoke: (id: number) => act(() => $fetch<null>(invitation(id), { method: 'DELETE' })),
    refreshInvitations: () => refreshInvitations(),
  }
}
