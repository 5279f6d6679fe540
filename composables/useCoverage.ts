import type { GrowerCoverageReport } from '#shared/types/coverage'
import { showTonnage } from '#shared/utils/units'

/** A grower's forecast per juice class and year against its fruit contracts. */
export function useCoverage(span: MaybeRefOrGetter<{ startYear?: number, years?: number }> = {}) {
  const { data: coverage, pending, error, refresh } = useFetch<GrowerCoverageReport>('/api/coverage', { key: 'coverage', query: computed(() => toValue(span)) })
  return { coverage, pending, error, refresh }
}

/**
 * kg shown as tonnes or short tons, the units fruit is contracted in, per the person's
 * preference; `value` for a number box, `text` with the unit.
 */
export function useTonnage() {
  const show = useUnitDisplay()
  const value = (kg: number) => showTonnage(kg / 1000, show.system.value).value
  return {
    unit: show.tonnageUnit,
    value,
    text: (kg: number, digits = 1) => `${formatNumber(value(kg), digits)} ${show.tonnageUnit.value}`,
  }
}
