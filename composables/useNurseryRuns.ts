import { eventCreateSchema, type EventKind, type LossCause, type RowCreateInput, type RunCreateInput } from '#shared/schemas/nursery'
import type { TreeContract, TreeContractList } from '#shared/types/contract'
import type { BudwoodLot, NurseryBed, NurseryRow, NurseryRun, PropagationEvent, RunTag } from '#shared/types/nursery'
import type { SendOutcome } from './useOfflineQueue'

interface List<T> { items: T[], total: number }

// The reads a new row, a new run or a recorded event changes.
const MAP_KEYS = ['nursery-rows', 'nursery-map', 'nursery-runs']
const runKey = (id: number) => `nursery-run-${id}`
const eventsKey = (id: number) => `nursery-run-events-${id}`

// Lists answer at most 200 a page; the map and the tag sheet need them all.
const PAGE = 200
const MOST_PAGES = 50

// Reads inside useAsyncData go through the request's own fetch, so that on the server they carry
// the person's session cookie.
type Fetch = ReturnType<typeof useRequestFetch>

async function fetchAll<T>(request: Fetch, url: string, query: Record<string, unknown> = {}): Promise<List<T>> {
  const items: T[] = []
  let total = 0
  for (let page = 0; page < MOST_PAGES; page++) {
    const answer = await request<List<T>>(url, { query: { ...query, limit: PAGE, offset: page * PAGE } })
    items.push(...answer.items)
    total = answer.total
    if (items.length >= total || answer.items.length === 0) break
  }
  return { items, total }
}

/** Today's date where the person is, as YYYY-MM-DD (a field entry is dated by the phone's own day). */
export function localToday(): string {
  const now = new Date()
  return `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`
}

/**
 * What a number box holds, for the shared schema: empty is undefined (the schema says what is
 * missing), anything else a number, NaN if it is none. A type="number" box may hand over a number.
 */
export function typedNumber(value: string | number): number | undefined {
  const text = String(value).trim()
  return text === '' ? undefined : Number(text)
}

/** As typedNumber, but empty is null: a field that may be left out. */
export function typedNumberOrNull(value: string | number): number | null {
  return typedNumber(value) ?? null
}

/** Where a run lies, in words: "Long Field, row 3, positions 1–120". */
export function runPlace(run: Pick<NurseryRun, 'fieldName' | 'rowName' | 'fromPosition' | 'toPosition'>): string {
  const positions = run.fromPosition === run.toPosition ? `position ${run.fromPosition}` : `positions ${run.fromPosition}–${run.toPosition}`
  return `${run.fieldName}, row ${run.rowName}, ${positions}`
}

/** The rootstock with its interstem, as a label reads: "Quince A / Beurré Hardy". */
export function runStock(run: Pick<NurseryRun, 'rootstockDesignation' | 'interstem'>): string {
  return run.interstem ? `${run.rootstockDesignation} with ${run.interstem} interstem` : run.rootstockDesignation
}

/** The rows of the nursery's fields, and every run on them, for the map. */
export function useNurseryMap() {
  const rows = useNurseryRows()
  const request = useRequestFetch()
  const runs = useAsyncData('nursery-map', () => fetchAll<NurseryRun>(request, '/api/nursery/runs'))
  return {
    rows: rows.rows,
    runs: computed(() => runs.data.value?.items),
    error: computed(() => rows.error.value ?? runs.error.value),
  }
}

/** The nursery's rows, for the run form's choice of row. */
export function useNurseryRows() {
  const request = useRequestFetch()
  const { data, pending, error, refresh } = useAsyncData('nursery-rows', () => fetchAll<NurseryRow>(request, '/api/nursery/rows'))
  return { rows: computed(() => data.value?.items), pending, error, refresh }
}

/** The nursery-row fields (beds of kind `field`) rows are laid out in. */
export function useNurseryFields() {
  const request = useRequestFetch()
  const { data, error } = useAsyncData('nursery-fields', () => fetchAll<NurseryBed>(request, '/api/nursery/beds', { kind: 'field' }))
  return { fields: computed(() => data.value?.items.filter(b => b.kind === 'field')), error }
}

/** Adds a row to a field; a refusal is thrown for the form to show beside its fields. */
export function useRowCreate() {
  const { save, pending } = useSave<NurseryRow>('/api/nursery/rows', { refreshes: MAP_KEYS })
  return { create: (body: RowCreateInput) => save(body), pending }
}

/** What the runs list filters on; an empty string is no filter. */
export interface RunFilterValues { varietyId: string, rootstockId: string, treeContractId: string, rowId: string, hasWarnings: '' | 'true' | 'false' }
export const RUN_PAGE_SIZE = 50

/** One page of runs by the filters; a change of filter goes back to the first page. */
export function useRunList(filters: Ref<RunFilterValues>) {
  const offset = ref(0)
  watch(filters, () => {
    offset.value = 0
  }, { deep: true })
  const query = computed(() => ({
    limit: RUN_PAGE_SIZE,
    offset: offset.value,
    ...Object.fromEntries(Object.entries(filters.value).filter(([, v]) => v !== '')),
  }))
  return { ...usePagedList<NurseryRun>('/api/nursery/runs', query, 'nursery-runs'), offset }
}

/** Lines out a run; a refusal (fields, an overlap, too few liners) is thrown for the form to show. */
export function useRunCreate() {
  const { save, pending } = useSave<NurseryRun>('/api/nursery/runs', { refreshes: MAP_KEYS })
  return { create: (body: RunCreateInput) => save(body), pending }
}

/** One run with its events. */
export function useNurseryRun(id: MaybeRefOrGetter<number>) {
  const run = useFetch<NurseryRun>(() => `/api/nursery/runs/${toValue(id)}`, { key: () => runKey(toValue(id)) })
  const events = useFetch<List<PropagationEvent>>(() => `/api/nursery/runs/${toValue(id)}/events`, { key: () => eventsKey(toValue(id)), query: { limit: PAGE } })
  return {
    run: run.data,
    events: computed(() => events.data.value?.items),
    error: run.error,
    eventsError: events.error,
    // A recorded event may do a task of the season calendar.
    refresh: () => refreshNuxtData([runKey(toValue(id)), eventsKey(toValue(id)), runTasksKey(toValue(id)), 'nursery-tasks', ...MAP_KEYS]),
  }
}

/** The run a tag's code names, awaited so that the page can send the person on before it renders. */
export async function useRunByTag(code: MaybeRefOrGetter<string>) {
  const { data: run, error } = await useFetch<NurseryRun>(() => `/api/nursery/runs/by-tag/${encodeURIComponent(toValue(code))}`, { key: () => `nursery-tag-${toValue(code)}` })
  return { run, error }
}

export interface TagSheetEntry { run: NurseryRun, tag: RunTag }

/** The runs of a tag sheet with their tags, in the order asked for; and recording that they were printed. */
export function useTagSheet(ids: MaybeRefOrGetter<number[]>) {
  const request = useRequestFetch()
  const { data, pending, error } = useAsyncData(() => `nursery-tags-${toValue(ids).join(',')}`, async () => {
    return Promise.all(toValue(ids).map(async id => ({
      run: await request<NurseryRun>(`/api/nursery/runs/${id}`),
      tag: await request<RunTag>(`/api/nursery/runs/${id}/tag`),
    })))
  })
  const { pending: recording, error: recordError, run } = useAction('The tags printed but could not be recorded as printed. Try printing again.')
  const recordPrinted = (runIds: number[]) => run(async () => {
    await $fetch('/api/nursery/tags/printed', { method: 'POST', body: { runIds } })
    await refreshNuxtData(MAP_KEYS)
  })
  return { entries: data, pending, error, recordPrinted, recording, recordError }
}

// A run serves a contract that is accepted, under way or ready (the server refuses any other).
const CONTRACT_STATES_FOR_RUNS = ['accepted', 'propagating', 'ready']

/** Tree contracts a run may serve: accepted, under way or ready, where this organisation is the nursery. */
export function useNurseryContracts() {
  const request = useRequestFetch()
  const { data, error } = useAsyncData('nursery-contracts', async () => {
    const lists = await Promise.all(CONTRACT_STATES_FOR_RUNS.map(state => request<TreeContractList>('/api/tree-contracts', { query: { state, limit: PAGE } })))
    return lists.flatMap(list => list.items).filter(c => c.side === 'nursery')
  })
  return { contracts: computed<TreeContract[] | undefined>(() => data.value ?? undefined), error }
}

/** The nursery's budwood lots, for the budding form. */
export function useBudwoodLotChoices() {
  const request = useRequestFetch()
  const { data, error } = useAsyncData('nursery-budwood-choices', () => fetchAll<BudwoodLot>(request, '/api/nursery/budwood'))
  return { lots: computed(() => data.value?.items), error }
}

/** The choices of the run form and the runs filters: catalogue, rows and the contracts runs may serve. */
export function useRunChoices() {
  const catalogue = useBlockChoices()
  const { rows, error: rowsError } = useNurseryRows()
  const { contracts, error: contractsError } = useNurseryContracts()
  return {
    varieties: catalogue.varieties,
    rootstocks: catalogue.rootstocks,
    rows,
    contracts,
    error: computed(() => catalogue.error.value ?? ((rowsError.value || contractsError.value) ? 'The rows or contracts could not be loaded. Reload the page to try again.' : null)),
  }
}

// ----- Events -----

export const EVENT_LABELS: Record<EventKind, string> = {
  'lined-out': 'Lined out',
  'interstem-budded': 'Interstem budded',
  'budded': 'Budded',
  'grafted': 'Grafted',
  'take-counted': 'Take counted',
  'headed-back': 'Headed back',
  'shoots-removed': 'Rootstock shoots removed',
  'staked': 'Staked',
  'knip-cut-back': 'Cut back to a knip',
  'loss': 'Loss',
  'dug': 'Dug',
}

export const CAUSE_LABELS: Record<LossCause, string> = {
  'failed-take': 'Bud failed to take',
  'winter-injury': 'Winter injury',
  'rodents': 'Voles, rabbits or other animals',
  'fire-blight': 'Fire blight',
  'other-disease': 'Other disease',
  'breakage': 'Broken',
  'mislabel': 'Wrong variety (mislabelled)',
  'other': 'Other',
}

export const METHOD_LABELS: Record<string, string> = {
  'chip-bud': 'Chip bud',
  't-bud': 'T-bud',
  'whip-and-tongue': 'Whip and tongue',
  'cleft': 'Cleft graft',
  'bench': 'Bench graft',
  'other-graft': 'Another graft',
}

/** One event's particulars in a line: "12, rodents", "chip bud, Dabinett, lot B-24, 15 cm, 300". */
export function eventDetails(e: PropagationEvent): string {
  const n = (v: number) => formatNumber(v)
  switch (e.kind) {
    case 'loss': return `${n(e.count ?? 0)} lost: ${CAUSE_LABELS[e.cause as LossCause] ?? e.cause ?? 'cause not given'}`
    case 'take-counted': return `${n(e.count ?? 0)} took`
    case 'lined-out': return `${n(e.count ?? 0)} liners`
    case 'interstem-budded':
      return [METHOD_LABELS[e.method ?? ''] ?? e.method, e.budwoodLabel ? `budwood ${e.budwoodLabel}` : 'no budwood lot named', `${n(e.count ?? 0)} budded`,
        e.dayOrder ? `no. ${e.dayOrder} that day` : null].filter(Boolean).join(', ')
    case 'budded':
    case 'grafted':
      return [METHOD_LABELS[e.method ?? ''] ?? e.method, e.varietyName, e.budwoodLabel ? `budwood ${e.budwoodLabel}` : 'no budwood lot named',
        e.budHeightCm !== null ? `${formatNumber(e.budHeightCm, 1)} cm up` : null, `${n(e.count ?? 0)} worked`, e.dayOrder ? `no. ${e.dayOrder} that day` : null]
        .filter(Boolean).join(', ')
    case 'shoots-removed': return e.passNo ? `pass ${e.passNo}` : ''
    case 'dug': return (e.grades ?? []).map(g => `${n(g.count)} at ${formatNumber(g.caliperMm, 1)} mm${g.heightCm ? `, ${g.heightCm} cm` : ''}${g.feathered ? ', feathered' : ''}`).join('; ')
    default: return ''
  }
}

/** Sends an entry (or keeps it on the phone); answers how it went. */
export type RecordEntry = (body: Record<string, unknown>, label: string) => Promise<SendOutcome>

/**
 * A quick form's send: checked against the shared schema first, then recorded or kept on the
 * phone. A refusal shows beside the fields, what was typed kept; anything else is confirmed.
 */
export function useEventForm(record: RecordEntry) {
  const errors = useFormErrors()
  const pending = ref(false)
  const done = ref<string | null>(null)

  async function send(body: Record<string, unknown>, label: string): Promise<boolean> {
    done.value = null
    if (!errors.check(eventCreateSchema, body)) return false
    pending.value = true
    try {
      const outcome = await record(body, label)
      if (outcome.state === 'refused') {
        errors.fromResponse(outcome.error)
        return false
      }
      done.value = outcome.state === 'sent' ? `${label}: recorded.` : `${label}: kept on this phone, waiting to send.`
      return true
    }
    finally {
      pending.value = false
    }
  }
  return { errors, pending, done, send }
}
