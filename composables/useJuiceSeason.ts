import type { HarvestLot } from '#shared/types/lot'

export interface JuicePoint { id: number, code: string, varietyName: string, species: 'apple' | 'pear', netKg: number, brix: number | null, taGPerL: number | null, tanninGPerL: number | null, juiceClass: string | null, sampledOn: string }

/** The lots of a harvest year the signed-in organisation may see, each with its latest reading. */
export function useJuiceSeason(year: MaybeRefOrGetter<number>) {
  const { data, pending, error } = useFetch<{ items: HarvestLot[], total: number }>('/api/lots', {
    key: computed(() => `juice-season-${toValue(year)}`),
    query: computed(() => ({ harvestYear: toValue(year), limit: 500 })),
  })
  const points = computed<JuicePoint[]>(() => (data.value?.items ?? [])
    .filter(lot => lot.latestReading)
    .map(lot => ({
      id: lot.id, code: lot.code, varietyName: lot.varietyName, species: lot.species, netKg: lot.netKg,
      brix: lot.latestReading!.brix, taGPerL: lot.latestReading!.taGPerL, tanninGPerL: lot.latestReading!.tanninGPerL,
      juiceClass: lot.juiceClass, sampledOn: lot.latestReading!.sampledOn,
    })))
  const withoutReading = computed(() => (data.value?.items ?? []).filter(lot => !lot.latestReading).length)
  return { points, withoutReading, total: computed(() => data.value?.total ?? 0), pending, error }
}
