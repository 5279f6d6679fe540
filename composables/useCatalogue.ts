import type { z } from 'zod'
import type { Species } from '#shared/schemas/catalogue'
import type { Rootstock, Variety } from '#shared/types/catalogue'
import { juiceClass, type JuiceClass } from '#shared/utils/juiceClass'

export type CatalogueKind = 'varieties' | 'rootstocks'

/** What the catalogue filters hold: search text, species, and juice class (varieties) or vigour (rootstocks). */
export interface CatalogueFilterValues { q: string, species: Species | '', group: string }

export const CATALOGUE_PAGE_SIZE = 25

/** The `useFetch` key of a catalogue list, for a write to refresh it. */
function catalogueListKey(kind: CatalogueKind): string {
  return `catalogue-${kind}`
}

/**
 * One page of varieties or rootstocks, fetched again whenever the search, a filter or the page
 * changes. A new search or filter goes back to the first page.
 */
function useCatalogueList<T>(kind: CatalogueKind, filters: Ref<CatalogueFilterValues>) {
  const offset = ref(0)
  const search = usePausedText(() => filters.value.q)
  watch(() => [search.value, filters.value.species, filters.value.group], () => {
    offset.value = 0
  })

  const groupParam = kind === 'varieties' ? 'juiceClass' : 'vigour'
  const query = computed(() => ({
    limit: CATALOGUE_PAGE_SIZE,
    offset: offset.value,
    q: search.value.trim() || undefined,
    species: filters.value.species || undefined,
    [groupParam]: filters.value.group || undefined,
  }))
  return { ...usePagedList<T>(`/api/${kind}`, query, catalogueListKey(kind)), offset }
}

export function useVarietyList(filters: Ref<CatalogueFilterValues>) {
  return useCatalogueList<Variety>('varieties', filters)
}

export function useRootstockList(filters: Ref<CatalogueFilterValues>) {
  return useCatalogueList<Rootstock>('rootstocks', filters)
}

/** One variety or rootstock, and (for the platform admin) deleting it. */
export function useCatalogueEntry<T extends Variety | Rootstock>(kind: CatalogueKind, id: MaybeRefOrGetter<number>) {
  const { data: entry, pending, error, refresh } = useFetch<T>(() => `/api/${kind}/${toValue(id)}`, { key: () => `${kind}-${toValue(id)}` })
  const { remove, removing, removeError } = useDelete(() => `/api/${kind}/${toValue(id)}`, 'That could not be deleted. Try again.', { refreshes: [catalogueListKey(kind)] })
  return { entry, pending, error, refresh, remove, removing, removeError }
}

/** Where the catalogue lists entries of this kind. */
export function catalogueListPath(kind: CatalogueKind): string {
  return kind === 'varieties' ? '/catalogue' : '/catalogue?tab=rootstocks'
}

/**
 * The page of the variety or rootstock the route names: what went wrong loading or deleting it,
 * editing it in place, or deleting it after asking and going back to the list (the page shows
 * those buttons to the platform admin only).
 */
export function useCatalogueEntryPage<T extends Variety | Rootstock>(kind: CatalogueKind, nameOf: (entry: T) => string) {
  const route = useRoute()
  const id = computed(() => Number(route.params.id))
  const { entry, error: loadError, remove, removing, removeError } = useCatalogueEntry<T>(kind, id)
  const editing = ref(false)

  const noun = kind === 'varieties' ? 'variety' : 'rootstock'
  const error = computed(() => {
    if (!loadError.value) return removeError.value
    return loadError.value.statusCode === 404 ? `That ${noun} is not in the catalogue.` : `The ${noun} could not be loaded.`
  })

  function saved(updated: T) {
    // useFetch types its data through a pick over T, which a generic T cannot be checked against.
    entry.value = updated as typeof entry.value
    editing.value = false
  }

  async function confirmRemove() {
    if (!window.confirm(`Delete ${entry.value ? nameOf(entry.value as T) : undefined} from the catalogue?`)) return
    if (await remove()) await navigateTo(catalogueListPath(kind))
  }

  return { entry, editing, error, removing, saved, confirmRemove }
}

/** Adds a catalogue row, or saves changes to one; a refusal is thrown for the form to show beside its fields. */
export function useCatalogueSave<T extends Variety | Rootstock>(kind: CatalogueKind) {
  return useSave<T>(`/api/${kind}`, { refreshes: [catalogueListKey(kind)] })
}

/**
 * A catalogue form's submit: checks the body with the patch schema when editing an entry (the create
 * schema when adding one), saves it and says so, then hands the saved entry on. A refusal shows
 * beside the fields and what was typed stays.
 */
export function useCatalogueForm<T extends Variety | Rootstock>(kind: CatalogueKind, form: {
  entry: () => T | undefined
  create: z.ZodType<object>
  patch: z.ZodType<object>
  body: () => unknown
  saved: (saved: T) => void
}) {
  const { save, pending } = useCatalogueSave<T>(kind)
  const errors = useFormErrors()
  const done = ref<string | null>(null)

  async function submit() {
    done.value = null
    const entry = form.entry()
    const input = errors.check(entry ? form.patch : form.create, form.body())
    if (!input) return
    try {
      const saved = await save(input, entry?.id)
      done.value = 'Saved.'
      form.saved(saved)
    }
    catch (e) {
      errors.fromResponse(e)
    }
  }

  return { submit, pending, errors, done }
}

/** A stored figure as form text: empty when the catalogue lacks it. */
export function catalogueFigureText(value: number | null | undefined, digits = 2): string {
  return value === null || value === undefined ? '' : String(Number(value.toFixed(digits)))
}

/** Form text (or the number a number box gives) as a figure: empty is null, anything else a number (NaN if not one). */
export function catalogueFigure(text: string | number, toSi: (n: number) => number = n => n): number | null {
  const trimmed = String(text).trim()
  if (trimmed === '') return null
  const n = Number(trimmed)
  return Number.isNaN(n) ? n : toSi(n)
}

/**
 * The class a variety's typical acid and tannin would get by its species' thresholds (Long Ashton
 * for apples, Pollard and Beech for perry pears), or null when a figure is missing. Shown beside the
 * published label, which it does not replace.
 */
export function catalogueThresholdClass(v: { species: Species, typicalTaGPerL: number | null, typicalTanninGPerL: number | null }): JuiceClass | null {
  return v.typicalTaGPerL === null || v.typicalTanninGPerL === null ? null : juiceClass(v.typicalTaGPerL, v.typicalTanninGPerL, v.species)
}
