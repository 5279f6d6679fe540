import type { ContractHistory, FruitContract, TreeContract } from '#shared/types/contract'
import type { DirectoryEntry } from '#shared/types/organisation'
import type { ContractKind } from '#shared/utils/contractStatus'
import { showTonnage } from '#shared/utils/units'

/** The contract each kind's routes answer with. */
export interface ContractOf { tree: TreeContract, fruit: FruitContract }

/** The list filters as the boxes hold them: empty is no filter. */
export interface ContractFilterValues { state: string, counterpartyId: string, year: string }

/** One harvest year of a fruit contract as its form's boxes hold it (tonnes in the reader's units). */
export interface ScheduleRow {
  key: number
  year: string
  tonnes: string
  windowFrom: string
  windowTo: string
  /** The tonnes as the contract had them, so that a year left alone is sent back unchanged. */
  readTonnes?: number
}

export const CONTRACT_PAGE_SIZE = 20

const BASE: Record<ContractKind, string> = { tree: '/api/tree-contracts', fruit: '/api/fruit-contracts' }

// The keys of the reads a write changes: a kind's list, one contract and its history.
const listKey = (kind: ContractKind) => `contracts-${kind}`
const contractKey = (kind: ContractKind, id: number) => `contract-${kind}-${id}`
const historyKey = (kind: ContractKind, id: number) => `contract-${kind}-${id}-history`

interface ErrorAnswer { statusCode?: number, data?: { message?: string, data?: { version?: number, state?: string } } }

/** One page of the organisation's contracts of one kind; a new filter goes back to the first page. */
export function useContractList<K extends ContractKind>(kind: K, filters: Ref<ContractFilterValues>) {
  const offset = ref(0)
  const year = usePausedText(() => filters.value.year)
  watch(() => [filters.value.state, filters.value.counterpartyId, year.value], () => {
    offset.value = 0
  })
  const query = computed(() => ({
    limit: CONTRACT_PAGE_SIZE,
    offset: offset.value,
    state: filters.value.state || undefined,
    counterpartyId: filters.value.counterpartyId || undefined,
    // A year is asked for once it is one; a half-typed year lists everything.
    year: /^\d{4}$/.test(year.value.trim()) ? year.value.trim() : undefined,
  }))
  return { ...usePagedList<ContractOf[K]>(BASE[kind], query, listKey(kind)), offset }
}

/** One contract as the signed-in person sees it (their side, their moves), and its history. */
export function useContract<K extends ContractKind>(kind: K, id: MaybeRefOrGetter<number>) {
  // Plain strings: the typed-route inference of useFetch is too deep for these paths.
  const path = (): string => `${BASE[kind]}/${toValue(id)}`
  const historyPath = (): string => `${BASE[kind]}/${toValue(id)}/history`
  const { data: contract, error, refresh } = useFetch<ContractOf[K]>(path, { key: () => contractKey(kind, toValue(id)) })
  const history = useFetch<ContractHistory>(historyPath, { key: () => historyKey(kind, toValue(id)), query: { limit: 200 } })
  return {
    contract,
    error,
    refresh,
    history: computed(() => history.data.value?.items),
    historyError: history.error,
  }
}

/** Posts one move (`offer`, `counter`, `accept`, …) and reads again what it changes. */
async function postMove<K extends ContractKind>(kind: K, id: number, action: string, body: Record<string, unknown>): Promise<ContractOf[K]> {
  const url: string = `${BASE[kind]}/${id}/${action}`
  const updated = await $fetch<ContractOf[K]>(url, { method: 'POST', body })
  await refreshNuxtData([historyKey(kind, id), listKey(kind), 'notice-count'])
  return updated
}

/**
 * The moves on one contract: each posts to its own route and puts the answer in place of the
 * contract shown. A refusal because the contract moved on (409) reads it again; an acceptance the
 * terms have overtaken says so.
 */
export function useContractMoves<K extends ContractKind>(kind: K, id: MaybeRefOrGetter<number>, contract: Ref<ContractOf[K] | null | undefined>) {
  const pending = ref<string | null>(null)
  const error = ref<string | null>(null)
  const done = ref<string | null>(null)

  async function run(action: string, label: string, body: Record<string, unknown> = {}): Promise<boolean> {
    pending.value = action
    error.value = null
    done.value = null
    try {
      const updated = await postMove(kind, toValue(id), action, body)
      contract.value = updated
      done.value = `${label}: done. The contract is now ${CONTRACT_STATE_LABELS[updated.state].toLowerCase()}.`
      return true
    }
    catch (e) {
      const answer = e as ErrorAnswer
      if (answer.statusCode === 409) {
        await refreshNuxtData([contractKey(kind, toValue(id)), historyKey(kind, toValue(id))])
        const version = answer.data?.data?.version
        error.value = action === 'accept' && version !== undefined
          ? `The terms changed since you opened this contract: it is now at version ${version}. Read them again before you accept.`
          : errorMessage(e, 'The contract has moved on since you opened it. It has been read again.')
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

  /** Shows a contract the page received another way (a saved draft, a counter-offer) as the one in place. */
  function replace(updated: ContractOf[K]) {
    contract.value = updated
    error.value = null
  }

  return { run, replace, pending, error, done }
}

/**
 * Writing terms: a new draft (POST), a draft's changes (PATCH) and a counter-offer (its move). A
 * refusal is thrown for the form to show beside its fields.
 */
export function useContractTerms<K extends ContractKind>(kind: K) {
  const pending = ref(false)
  async function write(request: () => Promise<ContractOf[K]>): Promise<ContractOf[K]> {
    pending.value = true
    try {
      return await request()
    }
    finally {
      pending.value = false
    }
  }
  return {
    pending,
    create: (body: Record<string, unknown>) => write(async () => {
      const created = await $fetch<ContractOf[K]>(BASE[kind], { method: 'POST', body })
      await refreshNuxtData([listKey(kind)])
      return created
    }),
    edit: (id: number, body: Record<string, unknown>) => write(async () => {
      const url: string = `${BASE[kind]}/${id}`
      const saved = await $fetch<ContractOf[K]>(url, { method: 'PATCH', body })
      await refreshNuxtData([historyKey(kind, id), listKey(kind)])
      return saved
    }),
    counter: (id: number, body: Record<string, unknown>) => write(() => postMove(kind, id, 'counter', body)),
  }
}

/** The listed organisations a contract may be made with (the directory's, the signed-in one's own left out). */
export function useCounterparties() {
  const { user } = useSessionUser()
  const { data, error } = useFetch<{ items: DirectoryEntry[], total: number }>('/api/organisations', { key: 'contract-counterparties', query: { limit: 200 } })
  return {
    organisations: computed(() => (data.value?.items ?? []).filter(o => o.id !== user.value?.orgId)),
    error: computed(() => (error.value ? 'The directory could not be loaded, so no organisation can be chosen. Reload the page to try again.' : null)),
  }
}

/** Tonnes in the reader's units: "40 t", or "44.092 short ton". */
export function useTonnes() {
  const { system, tonnageUnit } = useUnitDisplay()
  return {
    unit: tonnageUnit,
    tonnes: (t: number, digits = 3) => `${formatNumber(showTonnage(t, system.value).value, digits)} ${showTonnage(t, system.value).unit}`,
  }
}
