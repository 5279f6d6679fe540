/**
 * The invitation a link's token names, for the person accepting it (not signed in yet). Awaited, so
 * the page renders once it is known whether the invitation is still open.
 */
export async function useInvitation(token: string) {
  // One invitation per page; the key leaves the token (a credential) out.
  const { data: invitation, pending, error } = await useFetch('/api/invitations/accept', { key: 'invitation', query: { token } })
  return { invitation, pending, error }
}
