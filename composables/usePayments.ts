import type { PaymentCreateInput } from '#shared/schemas/payment'
import type { Payment, PaymentDetail, PaymentDueList, PaymentList, PaymentPurpose, PaymentState } from '#shared/types/payment'

/** The list filters as the boxes hold them: empty is no filter. */
export interface PaymentFilters { side: string, purpose: string, state: string }

export const PAYMENT_PAGE_SIZE = 50

// The keys of the reads a payment's write changes.
const LIST_KEY = 'payments'
const DUE_KEY = 'payments-due'
const paymentKey = (id: number) => `payment-${id}`
const WRITE_REFRESHES = [LIST_KEY, DUE_KEY, 'notice-count']

/** A payment's state in words, for a list and a page (never colour alone). */
export const PAYMENT_STATE_LABELS: Record<PaymentState, string> = {
  pending: 'Waiting for payment',
  succeeded: 'Paid',
  failed: 'Failed',
  refunded: 'Refunded',
}

export const PAYMENT_PURPOSE_LABELS: Record<PaymentPurpose, string> = {
  deposit: 'Tree deposit',
  balance: 'Tree balance',
  settlement: 'Delivery settlement',
}

/** One page of the organisation's payments, as payer or payee; a new filter goes back to the first page. */
export function usePayments(filters: Ref<PaymentFilters>) {
  const offset = ref(0)
  watch(() => ({ ...filters.value }), () => {
    offset.value = 0
  })
  const query = computed(() => ({
    limit: PAYMENT_PAGE_SIZE,
    offset: offset.value,
    ...Object.fromEntries(Object.entries(filters.value).filter(([, v]) => v !== '')),
  }))
  return { ...usePagedList<Payment>('/api/payments', query, LIST_KEY), offset }
}

/** What is owed and has no payment under way yet. */
export function usePaymentsDue() {
  const { data, error } = useFetch<PaymentDueList>('/api/payments/due', { key: DUE_KEY })
  return { items: computed(() => data.value?.items), error }
}

/** The payments of one tree contract or delivery, for its page. */
export function usePaymentsOf(query: MaybeRefOrGetter<{ treeContractId?: number, deliveryId?: number }>, key: string) {
  const { data, error } = useFetch<PaymentList>('/api/payments', { key, query: computed(() => ({ limit: 200, ...toValue(query) })) })
  return { items: computed(() => data.value?.items), error }
}

/**
 * One payment with its history. On the page the processor sends the payer back to, it is read
 * again every second while it is pending (the processor's event may land a moment later), for
 * at most `pollSeconds`.
 */
export function usePayment(id: MaybeRefOrGetter<number>, pollSeconds: MaybeRefOrGetter<number> = 0) {
  const { data: payment, error, refresh } = useFetch<PaymentDetail>(() => `/api/payments/${toValue(id)}`, { key: () => paymentKey(toValue(id)) })
  const polling = ref(false)
  if (import.meta.client) {
    let timer: ReturnType<typeof setInterval> | undefined
    onMounted(() => {
      const until = Date.now() + toValue(pollSeconds) * 1000
      if (Date.now() >= until) return
      polling.value = true
      timer = setInterval(async () => {
        if (payment.value && payment.value.state !== 'pending') polling.value = false
        if (!polling.value || Date.now() > until) {
          polling.value = false
          return clearInterval(timer)
        }
        await refresh()
      }, 1000)
    })
    onBeforeUnmount(() => clearInterval(timer))
  }
  return { payment, error, refresh, polling }
}

/**
 * Asks to pay (the live payment is answered when there is one) and sends the person to the
 * processor's hosted page; a refusal (a seller with no account, nothing owed) is shown.
 */
export function usePay() {
  const { pending, error, run } = useAction('The payment could not be started. Try again in a minute.')
  async function pay(input: PaymentCreateInput): Promise<void> {
    let url: string | null = null
    await run(async () => {
      const payment = await $fetch<Payment>('/api/payments', { method: 'POST', body: input })
      await refreshNuxtData(WRITE_REFRESHES)
      url = payment.checkoutUrl
      if (!url) await navigateTo(`/payments/${payment.id}`)
    })
    if (url) await navigateTo(url, { external: true })
  }
  return { pay, pending, error }
}

/** The payee's owners refund a returned deposit. */
export function useRefund(id: MaybeRefOrGetter<number>) {
  const { pending, error, run } = useAction('The refund could not be made. Try again in a minute.')
  const done = ref<string | null>(null)
  async function refund(reason?: string): Promise<void> {
    done.value = null
    const ok = await run(async () => {
      const url: string = `/api/payments/${toValue(id)}/refund`
      await $fetch(url, { method: 'POST', body: reason ? { reason } : {} })
      await refreshNuxtData([paymentKey(toValue(id)), ...WRITE_REFRESHES])
    })
    if (ok) done.value = 'The refund is on its way to the payer. Both sides have been told.'
  }
  return { refund, pending, error, done }
}
