import type { BlendCandidateLot, BlendProperty, BlendSolveRequest, BlendSolveResponse, BlendTarget, BlendTargetRanges } from '#shared/types/blend'
import { loosenRanges, savingPerStep } from '#shared/utils/blendDisplay'
import { draftRequest, type BlendLoosening } from '~/stores/blendDraft'

/** The lot filters as the boxes hold them: empty is no filter; the free kg is in kg. */
export interface BlendLotFilters { juiceClass: string, varietyId: string, growerId: string, state: string, minFreeKg: string, q: string }

/** What a saved target is written as. */
export interface BlendTargetBody { name: string, ranges: BlendTargetRanges, volumeL: number | null }

const TARGETS_KEY = 'blend-targets'

/** The lots the maker may blend, by the filters given (blank ones left out). */
export function useBlendLots(filters: MaybeRefOrGetter<BlendLotFilters>) {
  const query = computed(() => ({ limit: 200, ...Object.fromEntries(Object.entries(toValue(filters)).filter(([, v]) => v !== '')) }))
  const { data, pending, error } = useFetch<{ items: BlendCandidateLot[], total: number }>('/api/blends/lots', { key: 'blend-lots', query })
  return { lots: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), pending, error }
}

/** The organisation's saved targets, and saving, renaming and deleting one; a refusal is thrown for the form to show. */
export function useBlendTargets() {
  const { data, error } = useFetch<{ items: BlendTarget[], total: number }>('/api/blend-targets', { key: TARGETS_KEY, query: { limit: 200 } })
  const pending = ref(false)
  async function write<T>(request: () => Promise<T>): Promise<T> {
    pending.value = true
    try {
      const answer = await request()
      await refreshNuxtData(TARGETS_KEY)
      return answer
    }
    finally {
      pending.value = false
    }
  }
  return {
    targets: computed(() => data.value?.items ?? []),
    error,
    pending,
    create: (body: BlendTargetBody) => write(() => $fetch<BlendTarget>('/api/blend-targets', { method: 'POST', body })),
    update: (id: number, body: Partial<BlendTargetBody>) => write(() => $fetch<BlendTarget>(`/api/blend-targets/${id}`, { method: 'PATCH', body })),
    remove: (id: number) => write(() => $fetch<null>(`/api/blend-targets/${id}`, { method: 'DELETE' })),
  }
}

/** Solves a blend; the server's refusal (400 naming the fields, 404 for a lot gone) is kept to show. */
export function useBlendSolve() {
  const pending = ref(false)
  const error = ref<string | null>(null)
  const issues = ref<{ path: string, message: string }[]>([])
  async function solve(request: BlendSolveRequest): Promise<BlendSolveResponse | null> {
    pending.value = true
    error.value = null
    issues.value = []
    try {
      return await $fetch<BlendSolveResponse>('/api/blends/solve', { method: 'POST', body: request })
    }
    catch (e) {
      const answer = e as { data?: { data?: { issues?: { path: string, message: string }[] } } }
      issues.value = answer.data?.data?.issues ?? []
      error.value = errorMessage(e, 'The blend could not be solved. Check your connection and try again.')
      return null
    }
    finally {
      pending.value = false
    }
  }
  return { solve, pending, error, issues }
}

/**
 * The planner's draft and its solving: the draft kept for the signed-in person is taken up once the
 * page is in the browser; each solve keeps what was asked beside the answer; loosening a binding
 * range moves that bound one step outward in the draft and solves again.
 */
export function useBlendPlanner() {
  const store = useBlendDraftStore()
  const { draft } = storeToRefs(store)
  const { user } = useSessionUser()
  const { solve: post, pending, error, issues } = useBlendSolve()
  onMounted(() => {
    if (user.value) store.restore(String(user.value.id))
  })

  async function solve(loosened?: BlendLoosening) {
    const request = draftRequest(draft.value)
    const response = await post(request)
    if (response) draft.value.solved = loosened ? { request, response, loosened } : { request, response }
  }
  /** The saving said is a rate at the blend solved; the solve after it shows what the step really saved. */
  async function loosen(property: BlendProperty, bound: 'min' | 'max') {
    const solved = draft.value.solved
    const binding = solved?.response.binding.find(b => b.property === property && b.bound === bound)
    if (!solved?.request.target[property] || !binding) return
    const to = loosenRanges(solved.request.target, property, bound)[property]![bound]
    draft.value.ranges[property][bound] = to
    await solve({ property, bound, to, saidMinor: savingPerStep(binding), costBefore: solved.response.cost })
  }
  const issueMap = computed(() => Object.fromEntries(issues.value.map(i => [i.path, i.message])))
  return { draft, solve, loosen, pending, error, issues: issueMap, clear: store.clear }
}
