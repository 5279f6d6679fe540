import type { LabImportResult, LabSheetMapping } from '#shared/types/labImport'
import type { HarvestLot } from '#shared/types/lot'
import type { ColumnMapping, DateFormat, RowIssue } from '#shared/utils/labImport'

const mappingKey = (id: number) => `lab-sheet-mapping-${id}`

/** A sheet's headers, first rows and the mapping to offer (the saved one for its headers, else a suggestion). */
export function useLabSheetMapping(id: MaybeRefOrGetter<number>) {
  const { data, error, pending } = useFetch<LabSheetMapping>(() => `/api/lab-sheets/${toValue(id)}/mapping`, { key: () => mappingKey(toValue(id)) })
  return { sheet: data, error, pending }
}

export interface LabImportRequest { mapping: ColumnMapping, dateFormat: DateFormat, decimalComma: boolean, skipBadRows: boolean }

/**
 * Imports the sheet: the result, or the bad rows by row and field when the server refuses the whole
 * sheet (422); any other refusal is thrown for the form to show beside its fields.
 */
export function useLabSheetImport(id: MaybeRefOrGetter<number>) {
  const pending = ref(false)
  const rowErrors = ref<RowIssue[]>([])
  const result = ref<LabImportResult | null>(null)
  async function importSheet(body: LabImportRequest): Promise<void> {
    pending.value = true
    rowErrors.value = []
    try {
      result.value = await $fetch<LabImportResult>(`/api/lab-sheets/${toValue(id)}/import`, { method: 'POST', body })
      await refreshNuxtData(mappingKey(toValue(id)))
    }
    catch (e) {
      const data = e as { statusCode?: number, data?: { data?: { errors?: RowIssue[] } } }
      if (data.statusCode === 422 && data.data?.data?.errors) rowErrors.value = data.data.data.errors
      throw e
    }
    finally {
      pending.value = false
    }
  }
  return { pending, rowErrors, result, importSheet }
}

/** The organisation's lots, for typing a PDF sheet's readings by hand, and the write of one reading. */
export function useLabReadingEntry() {
  const { data, error } = useFetch<{ items: HarvestLot[], total: number }>('/api/lots', { key: 'lab-import-lots', query: { limit: 200 } })
  const pending = ref(false)
  async function addReading(lotId: number, body: Record<string, unknown>): Promise<void> {
    pending.value = true
    try {
      await $fetch(`/api/lots/${lotId}/readings`, { method: 'POST', body })
    }
    finally {
      pending.value = false
    }
  }
  return { lots: computed(() => data.value?.items), lotsError: error, pending, addReading }
}
