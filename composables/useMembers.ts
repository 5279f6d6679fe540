import type { MemberRole } from '#shared/types/auth'

export interface MemberRow { id: number, email: string, name: string, role: MemberRole, createdAt: string }
export interface InvitationRow { id: number, email: string, role: MemberRole, expiresAt: string }

/** The organisation's members and, for owners, its open invitations and the actions on them. */
export function useMembers(isOwner: Ref<boolean>) {
  const members = useFetch<{ items: MemberRow[], total: number }>('/api/members', { query: { limit: 200 } })
  const invitations = useFetch<{ items: InvitationRow[], total: number }>('/api/invitations', { immediate: isOwner.value })
  const { pending: busy, error: actionError, run } = useAction()

  async function act(request: () => Promise<unknown>) {
    if (await run(request)) await Promise.all([members.refresh(), isOwner.value ? invitations.refresh() : null])
  }

  // Plain strings: the typed-route inference of $fetch is too deep for these template paths.
  const member = (id: number): string => `/api/members/${id}`
  const invitation = (id: number): string => `/api/invitations/${id}`

  return {
    members,
    invitations,
    actionError,
    busy,
    changeRole: (id: number, role: MemberRole) => act(() => $fetch(member(id), { method: 'PATCH', body: { role } })),
    remove: (id: number) => act(() => $fetch(member(id), { method: 'DELETE' })),
    revoke: (id: number) => act(() => $fetch(invitation(id), { method: 'DELETE' })),
    refreshInvitations: () => invitations.refresh(),
  }
}
