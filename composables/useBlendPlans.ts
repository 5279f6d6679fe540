import type { BlendSolveRequest } from '#shared/types/blend'
import type { BlendPlan, BlendPlanList, LotTrace, PressingTrace } from '#shared/types/blendPlan'
import type { PressingInput } from '#shared/schemas/blendPlan'

// The maker's blend plans: the list, one plan with its moves and pressing, saving a solved blend as a
// plan, and the trace of a pressing and of a lot. Writes refresh the reads they change.

const LIST_KEY = 'blend-plans'
const planKey = (id: number) => `blend-plan-${id}`

/** One page of plans, by state (empty for all). */
export function useBlendPlans(state: MaybeRefOrGetter<string>) {
  const query = computed(() => ({ limit: 100, ...(toValue(state) ? { state: toValue(state) } : {}) }))
  const { data, error, pending } = useFetch<BlendPlanList>('/api/blend-plans', { key: LIST_KEY, query })
  return { plans: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), error, pending }
}

/** Saves the solved blend as a draft plan; the new plan, or null with the refusal kept to show. */
export function useSavePlan() {
  const { pending, error, run } = useAction('The plan could not be saved. Check your connection and try again.')
  async function save(name: string, request: BlendSolveRequest): Promise<BlendPlan | null> {
    let saved: BlendPlan | null = null
    await run(async () => {
      saved = await $fetch<BlendPlan>('/api/blend-plans', { method: 'POST', body: { name, request } })
    })
    if (saved) await refreshNuxtData(LIST_KEY)
    return saved
  }
  return { save, pending, error }
}

/** One plan, its moves (commit, release, delete) and its pressing. */
export function useBlendPlan(id: MaybeRefOrGetter<number>) {
  const { data, error } = useFetch<BlendPlan>(() => `/api/blend-plans/${toValue(id)}`, { key: planKey(toValue(id)) })
  const moving = useAction('The plan could not be changed. Check your connection and try again.')
  const conflictLots = ref<{ lotId: number, code: string, freeKg: number }[]>([])

  async function move(action: 'commit' | 'release'): Promise<boolean> {
    conflictLots.value = []
    return moving.run(async () => {
      data.value = await $fetch<BlendPlan>(`/api/blend-plans/${toValue(id)}/${action}`, { method: 'POST', body: {} })
      await refreshNuxtData([LIST_KEY, 'blend-lots'])
    }, (e) => {
      conflictLots.value = (e as { data?: { data?: { lots?: { lotId: number, code: string, freeKg: number }[] } } }).data?.data?.lots ?? []
    })
  }
  async function remove(): Promise<boolean> {
    return moving.run(async () => {
      await $fetch<null>(`/api/blend-plans/${toValue(id)}`, { method: 'DELETE' })
      await refreshNuxtData(LIST_KEY)
    })
  }
  /** Records the pressing; the form's errors are the caller's to show. */
  async function press(body: PressingInput): Promise<void> {
    data.value = await $fetch<BlendPlan>(`/api/blend-plans/${toValue(id)}/press`, { method: 'POST', body })
    await refreshNuxtData([LIST_KEY, 'blend-lots'])
  }
  return { plan: data, error, move, remove, press, moving: moving.pending, moveError: moving.error, conflictLots }
}

/** Where a pressing's fruit came from. */
export function usePressingTrace(id: MaybeRefOrGetter<number>) {
  const { data, error } = useFetch<PressingTrace>(() => `/api/pressings/${toValue(id)}/trace`, { key: `pressing-trace-${toValue(id)}` })
  return { trace: data, error }
}

/** The plans and pressings a lot went into, as far as the reader may see. */
export function useLotTrace(id: MaybeRefOrGetter<number>) {
  const { data, error } = useFetch<LotTrace>(() => `/api/lots/${toValue(id)}/trace`, { key: `lot-trace-${toValue(id)}` })
  return { trace: data, error }
}
