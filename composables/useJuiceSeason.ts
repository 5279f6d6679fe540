import type { HarvestLot, JuiceReading } from '#shared/types/lot'
import { sgToBrix } from '#shared/utils/sugar'

export interface JuicePoint { id: number, code: string, varietyName: string, species: 'apple' | 'pear', netKg: number, brix: number | null, brixFromSg: boolean, taGPerL: number | null, tanninGPerL: number | null, juiceClass: string | null, sampledOn: string }

/** °Brix as measured, or from the SG (NBS sucrose table's fit, shared/utils/sugar.ts) when only SG was read. */
function sugarOf(r: JuiceReading): { brix: number | null, brixFromSg: boolean } {
  if (r.brix !== null) return { brix: r.brix, brixFromSg: false }
  return r.sg === null ? { brix: null, brixFromSg: false } : { brix: Math.round(sgToBrix(r.sg) * 10) / 10, brixFromSg: true }
}

/** The lots of a harvest year the signed-in organisation may see, each with its latest reading. */
export function useJuiceSeason(year: MaybeRefOrGetter<number>) {
  const { data, pending, error } = useFetch<{ items: HarvestLot[], total: number }>('/api/lots', {
    key: computed(() => `juice-season-${toValue(year)}`),
    query: computed(() => ({ harvestYear: toValue(year), limit: 200 })),
  })
  const points = computed<JuicePoint[]>(() => (data.value?.items ?? [])
    .filter(lot => lot.latestReading)
    .map(lot => ({
      id: lot.id, code: lot.code, varietyName: lot.varietyName, species: lot.species, netKg: lot.netKg,
      ...sugarOf(lot.latestReading!), taGPerL: lot.latestReading!.taGPerL, tanninGPerL: lot.latestReading!.tanninGPerL,
      juiceClass: lot.juiceClass, sampledOn: lot.latestReading!.sampledOn,
    })))
  const withoutReading = computed(() => (data.value?.items ?? []).filter(lot => !lot.latestReading).length)
  return { points, withoutReading, total: computed(() => data.value?.total ?? 0), pending, error }
}
