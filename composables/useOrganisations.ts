import type { OrganisationAction, OrganisationActor, OrganisationState } from '#shared/utils/organisationStatus'

export interface OrganisationRow { id: number, name: string, kind: 'grower' | 'maker', isNursery: boolean, region: string | null, status: OrganisationState, members: number }

/**
 * Every organisation on the platform, for the platform admin, and moving one to another state
 * (one route per move: `…/[id]/suspend`). A refusal because the organisation has moved meanwhile
 * (409) reloads the list, so the buttons match its state again. Awaited, so the page renders with it.
 */
export async function useOrganisations() {
  const { user } = useSessionUser()
  const actor = computed<OrganisationActor | null>(() => (user.value ? { role: user.value.role } : null))
  const { pending: busy, error: actionError, run } = useAction()
  const { data, error, refresh } = await useFetch<{ items: OrganisationRow[], total: number }>('/api/admin/organisations', { key: 'admin-organisations', query: { limit: 200 } })

  async function move(org: OrganisationRow, action: OrganisationAction) {
    // A plain string: the typed-route inference of $fetch is too deep for this template path.
    const url: string = `/api/admin/organisations/${org.id}/${action}`
    let moved = false
    const done = await run(() => $fetch<null>(url, { method: 'POST' }), (e) => {
      moved = (e as { statusCode?: number }).statusCode === 409
    })
    if (done || moved) await refreshNuxtData('admin-organisations')
  }

  return { organisations: computed(() => data.value?.items), error, refresh, actor, busy, actionError, move }
}
