import { LAB_SHEET_MAX_BYTES } from '#shared/schemas/labSheet'
import type { LabSheetUploaded } from '#shared/types/labSheet'
import type { LabSheet } from '#shared/types/lot'

const LIST_KEY = 'lab-sheets'
export const LAB_SHEET_PAGE = 50

/** The organisation's lab sheets (and, for a maker, those of lots it may see), newest first. */
export function useLabSheets(offset: Ref<number>) {
  const query = computed(() => ({ limit: LAB_SHEET_PAGE, offset: offset.value }))
  return usePagedList<LabSheet>('/api/lab-sheets', query, LIST_KEY)
}

export interface LabSheetUploadItem {
  key: string
  name: string
  sizeBytes: number
  /** How much of the file has been sent, 0 to 1. */
  sent: number
  state: 'sending' | 'stored' | 'duplicate' | 'refused'
  /** Why it was refused, in words. */
  message: string | null
  sheet: LabSheetUploaded | null
}

const MiB = 1024 * 1024

/** A refusal in words a grower can act on. */
function refusal(status: number, body: { message?: string } | null, name: string): string {
  if (status === 413) return `${name} is too big: a lab sheet may be at most ${LAB_SHEET_MAX_BYTES / MiB} MiB.`
  if (status === 415) return body?.message ?? `${name} is not a CSV, XLSX or PDF file.`
  if (status === 503) return 'File storage is not answering, so the file was not kept. Try again in a minute.'
  if (status === 0) return 'The upload did not reach Pomewright. Check your connection and try again.'
  return body?.message ?? 'The file could not be uploaded. Try again.'
}

/**
 * Uploads each file in its own request, so each has its own progress (XMLHttpRequest reports what
 * it has sent; fetch does not) and its own answer; the list is fetched again when all are done.
 */
export function useLabSheetUpload() {
  const items = ref<LabSheetUploadItem[]>([])

  function send(item: LabSheetUploadItem, file: File): Promise<void> {
    return new Promise((resolve) => {
      const xhr = new XMLHttpRequest()
      const form = new FormData()
      form.append('file', file, file.name)
      xhr.upload.addEventListener('progress', (e) => {
        if (e.lengthComputable) item.sent = e.loaded / e.total
      })
      xhr.addEventListener('loadend', () => {
        let body: unknown = null
        try {
          body = JSON.parse(xhr.responseText)
        }
        catch { /* not JSON: the status says enough */ }
        if (xhr.status === 201) {
          const [sheet] = body as LabSheetUploaded[]
          item.sent = 1
          item.sheet = sheet ?? null
          item.state = sheet?.duplicateOf === undefined ? 'stored' : 'duplicate'
        }
        else {
          item.state = 'refused'
          item.message = refusal(xhr.status, body as { message?: string } | null, file.name)
        }
        resolve()
      })
      xhr.open('POST', '/api/lab-sheets')
      xhr.send(form)
    })
  }

  async function upload(files: File[]): Promise<void> {
    const started = files.map((file) => {
      const item = reactive<LabSheetUploadItem>({ key: `${Date.now()}-${Math.random()}`, name: file.name, sizeBytes: file.size, sent: 0, state: 'sending', message: null, sheet: null })
      items.value.unshift(item)
      if (file.size > LAB_SHEET_MAX_BYTES) {
        item.state = 'refused'
        item.message = refusal(413, null, file.name)
        return Promise.resolve()
      }
      return send(item, file)
    })
    await Promise.all(started)
    await refreshNuxtData(LIST_KEY)
  }

  const sending = computed(() => items.value.some(i => i.state === 'sending'))
  return { items, upload, sending }
}

/** A size as a person reads it. */
export function labSheetSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`
  if (bytes < MiB) return `${(bytes / 1024).toFixed(1)} KiB`
  return `${(bytes / MiB).toFixed(1)} MiB`
}
