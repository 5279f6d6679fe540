import type { ContractProgress } from '#shared/types/contractProgress'

/** States in which a tree contract's progress is shown: accepted, or later along the way. */
export const PROGRESS_STATES: readonly string[] = ['accepted', 'propagating', 'ready', 'delivered']

/** How a tree contract's trees are coming on, summed over the runs that serve it. */
export function useTreeContractProgress(id: MaybeRefOrGetter<number>) {
  // A plain string: the typed-route inference of useFetch is too deep for this path.
  const path = (): string => `/api/tree-contracts/${toValue(id)}/progress`
  const { data, error } = useFetch<ContractProgress>(path, { key: () => `contract-tree-${toValue(id)}-progress` })
  return { progress: data, error }
}
