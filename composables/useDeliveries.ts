import type { FruitContract, FruitContractList } from '#shared/types/contract'
import type { Delivery, DeliveryAction, DeliveryDetail, DeliveryList, ExcessDecision } from '#shared/types/delivery'
import type { HarvestLot, JuiceReading } from '#shared/types/lot'
import type { FruitPriceTerms } from '#shared/utils/settlement'
import { sgToBrix } from '#shared/utils/sugar'
import type { LotList } from '~/composables/useLots'

/** The list filters as the boxes hold them: empty is no filter. */
export interface DeliveryFilters { fruitContractId: string, harvestYear: string, state: string }

/** The weigh ticket as its boxes hold it, in the reader's mass unit. */
export interface WeighTicketText { ticketNo: string, gross: string, tare: string, net: string }

/** A lot a contract covers, with what is left of it to deliver and the °Brix of its latest reading. */
export interface DeliveryLotOption { lot: HarvestLot, leftKg: number, latestBrix: number | null }

export const DELIVERY_PAGE_SIZE = 50

// The keys of the reads a write changes: the lists, one delivery, and what the form sums.
const LIST_KEY = 'deliveries'
const deliveryKey = (id: number) => `delivery-${id}`
const WRITE_REFRESHES = [LIST_KEY, 'delivery-lot-list', 'delivery-contract-deliveries', 'notice-count']

/** What a delivery is paid on: a contract's sugar terms as settleLoad takes them. */
export function priceTermsOf(c: FruitContract): FruitPriceTerms {
  return {
    basePricePerTonneMinor: c.basePricePerTonneMinor,
    baselineBrix: c.baselineBrix,
    bonusPerBrixPerTonneMinor: c.bonusPerBrixPerTonneMinor,
    deductionPerBrixPerTonneMinor: c.deductionPerBrixPerTonneMinor,
    rejectFloorBrix: c.rejectFloorBrix,
    maxRotPct: c.maxRotPct,
    maxDamagePct: c.maxDamagePct,
  }
}

/** A reading's °Brix, or the °Brix its specific gravity gives when the lab gave only SG. */
export function readingBrix(r: JuiceReading): number | null {
  if (r.brix !== null) return r.brix
  return r.sg !== null ? Math.round(sgToBrix(r.sg) * 100) / 100 : null
}

/** One page of the deliveries the organisation is a party to, by the filters given; a new filter goes back to the first page. */
export function useDeliveries(filters: Ref<DeliveryFilters>) {
  const offset = ref(0)
  watch(() => ({ ...filters.value }), () => {
    offset.value = 0
  })
  const query = computed(() => ({
    limit: DELIVERY_PAGE_SIZE,
    offset: offset.value,
    ...Object.fromEntries(Object.entries(filters.value).filter(([, v]) => v !== '')),
  }))
  return { ...usePagedList<Delivery>('/api/deliveries', query, LIST_KEY), offset }
}

/** The deliveries of one lot or one contract (for the lot's and the contract's pages), under a key a write refreshes. */
export function useDeliveriesOf(query: MaybeRefOrGetter<{ lotId?: number, fruitContractId?: number, harvestYear?: number }>, key: string) {
  const { data, error } = useFetch<DeliveryList>('/api/deliveries', { key, query: computed(() => ({ limit: 200, ...toValue(query) })) })
  return { items: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), error }
}

/** The fruit contracts deliveries are made under: accepted ones, and fulfilled ones whose deliveries are still to be settled. */
export function useDeliveryContracts() {
  const accepted = useFetch<FruitContractList>('/api/fruit-contracts', { key: 'delivery-contracts-accepted', query: { state: 'accepted', limit: 200 } })
  const fulfilled = useFetch<FruitContractList>('/api/fruit-contracts', { key: 'delivery-contracts-fulfilled', query: { state: 'fulfilled', limit: 200 } })
  return {
    contracts: computed(() => [...(accepted.data.value?.items ?? []), ...(fulfilled.data.value?.items ?? [])].sort((a, b) => a.id - b.id)),
    error: computed(() => (accepted.error.value || fulfilled.error.value ? 'The fruit contracts could not be loaded. Reload the page to try again.' : null)),
  }
}

/** One fruit contract's terms, for a correction's live settlement. */
export function useDeliveryContract(id: MaybeRefOrGetter<number>) {
  const { data, error } = useFetch<FruitContract>(() => `/api/fruit-contracts/${toValue(id)}`, { key: () => `delivery-contract-${toValue(id)}` })
  return { contract: data, error }
}

/**
 * The lots a contract covers (the grower's lots of the contract's variety, or of its class and
 * species, picked in one of its harvest years), each with its kilograms not yet delivered.
 */
export function useDeliveryLots(contract: MaybeRefOrGetter<FruitContract | undefined>) {
  const query = computed(() => {
    const c = toValue(contract)
    if (!c) return { limit: 1 }
    return c.varietyId ? { varietyId: c.varietyId, limit: 200 } : { juiceClass: c.juiceClass ?? undefined, limit: 200 }
  })
  const lots = useFetch<LotList>('/api/lots', { key: 'delivery-lot-list', query, immediate: false, watch: false })
  const delivered = useFetch<DeliveryList>('/api/deliveries', {
    key: 'delivery-contract-deliveries',
    query: computed(() => ({ growerOrgId: toValue(contract)?.growerOrgId, limit: 200 })),
    immediate: false,
    watch: false,
  })
  watch(() => toValue(contract)?.id, async (id) => {
    if (id) await Promise.all([lots.refresh(), delivered.refresh()])
  }, { immediate: true })

  const options = computed<DeliveryLotOption[]>(() => {
    const c = toValue(contract)
    if (!c) return []
    const years = new Set(c.schedule.map(y => y.year))
    const deliveredKg = new Map<number, number>()
    for (const d of delivered.data.value?.items ?? []) deliveredKg.set(d.lotId, (deliveredKg.get(d.lotId) ?? 0) + d.netKg)
    return (lots.data.value?.items ?? [])
      .filter(l => l.orgId === c.growerOrgId && years.has(l.harvestYear) && (c.varietyId !== null || l.species === c.species))
      .map(lot => ({
        lot,
        leftKg: Math.max(0, Math.round((lot.netKg - (deliveredKg.get(lot.id) ?? 0)) * 10) / 10),
        latestBrix: lot.latestReading ? readingBrix(lot.latestReading) : null,
      }))
  })
  /** Net kilograms already delivered against each harvest year of the contract. */
  const deliveredByYear = computed(() => {
    const byYear = new Map<number, number>()
    for (const d of delivered.data.value?.items ?? []) {
      if (d.fruitContractId === toValue(contract)?.id) byYear.set(d.harvestYear, (byYear.get(d.harvestYear) ?? 0) + d.netKg)
    }
    return byYear
  })
  return {
    options,
    deliveredByYear,
    pending: computed(() => lots.pending.value || delivered.pending.value),
    error: computed(() => (lots.error.value || delivered.error.value ? 'The contract\'s lots could not be loaded. Reload the page to try again.' : null)),
  }
}

/** A lot's readings, newest first, for choosing the one paid on: read again whenever the lot changes. */
export function useDeliveryReadings(lotId: MaybeRefOrGetter<number | null>) {
  const readings = ref<JuiceReading[]>([])
  const pending = ref(false)
  const error = ref<string | null>(null)
  watch(() => toValue(lotId), async (id) => {
    readings.value = []
    error.value = null
    // The choice is made in the browser; the server's render has nothing to choose from yet.
    if (!id || import.meta.server) return
    pending.value = true
    try {
      const url: string = `/api/lots/${id}/readings`
      const answer = await $fetch<{ items: JuiceReading[] }>(url, { query: { limit: 200 } })
      // A slower answer for a lot chosen before is not shown for this one.
      if (toValue(lotId) === id) readings.value = answer.items
    }
    catch {
      error.value = 'The lot\'s readings could not be loaded. Choose the lot again to try again.'
    }
    finally {
      pending.value = false
    }
  }, { immediate: true })
  return { readings, pending, error }
}

/** One delivery as the signed-in person sees it: their side, their moves, its history and its contract year. */
export function useDelivery(id: MaybeRefOrGetter<number>) {
  const { data: delivery, error, refresh } = useFetch<DeliveryDetail>(() => `/api/deliveries/${toValue(id)}`, { key: () => deliveryKey(toValue(id)) })
  return { delivery, error, refresh }
}

/** Records a delivery, or corrects one (a new version); a refusal is thrown for the form to show beside its fields. */
export function useDeliverySave() {
  const pending = ref(false)
  async function save(body: Record<string, unknown>, id?: number): Promise<DeliveryDetail> {
    pending.value = true
    try {
      const url: string = id ? `/api/deliveries/${id}` : '/api/deliveries'
      const saved = await $fetch<DeliveryDetail>(url, { method: id ? 'PATCH' : 'POST', body })
      await refreshNuxtData(id ? [...WRITE_REFRESHES, deliveryKey(id)] : WRITE_REFRESHES)
      return saved
    }
    finally {
      pending.value = false
    }
  }
  return { save, pending }
}

/** A move with a route of its own (correcting is the form's PATCH). */
export type DeliveryMoveRoute = Exclude<DeliveryAction, 'edit'>
export interface DeliveryMoveBody { reason?: string, excess?: 'accept' | 'refuse' }

const MOVE_DONE: Record<DeliveryMoveRoute, string> = {
  'dispute': 'The delivery is disputed. The other side has been told.',
  'withdraw-dispute': 'The dispute is withdrawn.',
  'settle': 'The delivery is settled.',
}

/**
 * The moves on one delivery: each posts to its own route and reads the delivery again. A move the
 * delivery's state no longer allows (409) reads it again and says so.
 */
export function useDeliveryMoves(id: MaybeRefOrGetter<number>) {
  const pending = ref<DeliveryMoveRoute | null>(null)
  const error = ref<string | null>(null)
  const done = ref<string | null>(null)

  async function run(move: DeliveryMoveRoute, body: DeliveryMoveBody = {}): Promise<boolean> {
    pending.value = move
    error.value = null
    done.value = null
    try {
      const url: string = `/api/deliveries/${toValue(id)}/${move}`
      await $fetch(url, { method: 'POST', body })
      await refreshNuxtData([deliveryKey(toValue(id)), ...WRITE_REFRESHES])
      done.value = MOVE_DONE[move]
      return true
    }
    catch (e) {
      const answer = e as { statusCode?: number, data?: { data?: { state?: string } } }
      if (answer.statusCode === 409) {
        await refreshNuxtData([deliveryKey(toValue(id))])
        const state = answer.data?.data?.state
        error.value = state
          ? `The delivery is now ${DELIVERY_STATE_LABELS[state as keyof typeof DELIVERY_STATE_LABELS]?.toLowerCase() ?? state}, so that cannot be done. It has been read again.`
          : errorMessage(e, 'The delivery has moved on since you opened it. It has been read again.')
      }
      else {
        error.value = errorMessage(e, 'That did not work. Check your connection and try again.')
      }
      return false
    }
    finally {
      pending.value = null
    }
  }
  return { run, pending, error, done }
}

/** A delivery's state in words, for a list and a page (never colour alone). */
export const DELIVERY_STATE_LABELS = {
  recorded: 'Recorded',
  disputed: 'Disputed',
  settled: 'Settled',
  paid: 'Paid',
} as const

export const EXCESS_DECISION_LABELS: Record<ExcessDecision, string> = {
  accepted: 'accepted and paid for',
  refused: 'refused: not paid for',
}
