// Entries made in the field, kept on the phone until they reach the server. Each entry is stored in
// localStorage before it is sent, with a random key the server records it under, so an entry sent
// twice (the answer lost on the way back) is recorded once. The queue is sent, oldest first, when
// the connection returns and whenever the page comes back into view. An entry the server refuses
// (4xx) is kept with the server's message for the person to read, and never sent again.

export interface QueuedEntry {
  key: string
  url: string
  body: Record<string, unknown>
  /** What the person sees in the list of entries waiting, e.g. "Loss of 3 (rodents)". */
  label: string
  madeAt: string
  /** The server's message once it has refused the entry; null while it waits to be sent. */
  refused: string | null
}

export type SendOutcome = { state: 'sent' } | { state: 'waiting' } | { state: 'refused', error: unknown }

const STORAGE_KEY = 'pomewright.offline-entries.v1'
// Refusals that say "not now" rather than "not this": kept and sent again later.
const RETRY_STATUSES = new Set([408, 425, 429])

/** A random entry key of 22 letters, digits, - and _: crypto.getRandomValues works over plain http too. */
export function newClientKey(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16))
  return btoa(String.fromCharCode(...bytes)).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '')
}

function statusOf(error: unknown): number | undefined {
  const e = error as { statusCode?: number, status?: number, response?: { status?: number } }
  return e.response?.status ?? e.statusCode ?? e.status
}

function readStored(): QueuedEntry[] {
  try {
    const parsed: unknown = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '[]')
    return Array.isArray(parsed) ? parsed as QueuedEntry[] : []
  }
  catch {
    // A damaged store is replaced on the next write rather than blocking the page.
    return []
  }
}

let sending: Promise<Map<string, SendOutcome>> | null = null

/**
 * The phone's queue of entries. `onSent` runs after any entry reaches the server (to read the
 * page's data again); the page's listeners for the connection are added while it is mounted.
 */
export function useOfflineQueue(onSent?: () => unknown) {
  const entries = useState<QueuedEntry[]>('offline-entries', () => [])
  const online = ref(true)

  function save() {
    localStorage.setItem(STORAGE_KEY, JSON.stringify(entries.value))
  }

  async function sendOne(entry: QueuedEntry): Promise<SendOutcome> {
    try {
      await $fetch(entry.url, { method: 'POST', body: { ...entry.body, clientKey: entry.key } })
      return { state: 'sent' }
    }
    catch (error) {
      const status = statusOf(error)
      if (status && status >= 400 && status < 500 && !RETRY_STATUSES.has(status)) return { state: 'refused', error }
      return { state: 'waiting' }
    }
  }

  async function sendAll(): Promise<Map<string, SendOutcome>> {
    const outcomes = new Map<string, SendOutcome>()
    let sentAny = false
    for (const entry of entries.value.filter(e => e.refused === null)) {
      if (!navigator.onLine) break
      const outcome = await sendOne(entry)
      outcomes.set(entry.key, outcome)
      // No connection or a server in trouble: the rest waits too, in order.
      if (outcome.state === 'waiting') break
      if (outcome.state === 'sent') {
        sentAny = true
        entries.value = entries.value.filter(e => e.key !== entry.key)
      }
      else {
        entries.value = entries.value.map(e => (e.key === entry.key ? { ...e, refused: errorMessage(outcome.error, 'The server refused this entry.') } : e))
      }
      save()
    }
    if (sentAny) await onSent?.()
    return outcomes
  }

  /** Sends what is waiting, once at a time however often it is asked. */
  function flush(): Promise<Map<string, SendOutcome>> {
    sending ??= sendAll().finally(() => {
      sending = null
    })
    return sending
  }

  /**
   * Keeps an entry and tries to send it (after any older ones). Refused at once, it is dropped from
   * the queue and the refusal returned, for the form to show beside its fields.
   */
  async function submit(url: string, body: Record<string, unknown>, label: string): Promise<SendOutcome> {
    const entry: QueuedEntry = { key: newClientKey(), url, body, label, madeAt: new Date().toISOString(), refused: null }
    entries.value = [...entries.value, entry]
    save()
    if (sending) await sending
    const outcome = (await flush()).get(entry.key) ?? { state: 'waiting' }
    if (outcome.state === 'refused') dismiss(entry.key)
    return outcome
  }

  function dismiss(key: string) {
    entries.value = entries.value.filter(e => e.key !== key)
    save()
  }

  function onConnection() {
    online.value = navigator.onLine
    if (online.value) void flush()
  }
  function onVisible() {
    if (document.visibilityState === 'visible') onConnection()
  }

  onMounted(() => {
    entries.value = readStored()
    online.value = navigator.onLine
    window.addEventListener('online', onConnection)
    window.addEventListener('offline', onConnection)
    document.addEventListener('visibilitychange', onVisible)
    void flush()
  })
  onBeforeUnmount(() => {
    window.removeEventListener('online', onConnection)
    window.removeEventListener('offline', onConnection)
    document.removeEventListener('visibilitychange', onVisible)
  })

  return { entries, online, submit, flush, dismiss }
}
