import type { DispatchLabelSheet } from '#shared/types/dispatch'

/**
 * A tree contract's dispatch labels, bundled by the size chosen and for all its runs or one.
 * Read again whenever either changes; the nursery's session goes with a read made while the
 * server renders.
 */
export function useDispatchLabels(id: MaybeRefOrGetter<number>, choice: { bundleSize: Ref<number>, runId: Ref<number | null> }) {
  const request = useRequestFetch()
  const { data, pending, error } = useAsyncData(
    () => `dispatch-labels-${toValue(id)}-${choice.bundleSize.value}-${choice.runId.value ?? 'all'}`,
    () => request<DispatchLabelSheet>(`/api/tree-contracts/${toValue(id)}/dispatch-labels`, {
      query: { bundleSize: choice.bundleSize.value, ...(choice.runId.value ? { runId: choice.runId.value } : {}) },
    }),
  )
  return { sheet: data, pending, error }
}
