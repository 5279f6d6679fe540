// Payments as the API answers them: money in integer minor units with its currency, times ISO UTC.

export const PAYMENT_PURPOSES = ['deposit', 'balance', 'settlement'] as const
export type PaymentPurpose = typeof PAYMENT_PURPOSES[number]
export const PAYMENT_STATES = ['pending', 'succeeded', 'failed', 'refunded'] as const
export type PaymentState = typeof PAYMENT_STATES[number]
/** Which side of the payment the caller's organisation is on. */
export type PaymentSide = 'payer' | 'payee'
/** The moves a person makes: go to the processor's page to pay, or refund a returned deposit. */
export type PaymentAction = 'pay' | 'refund'

export interface Payment {
  id: number
  purpose: PaymentPurpose
  treeContractId: number | null
  deliveryId: number | null
  /** What it pays for, in words: "Deposit on 1,200 Dabinett on MM.106". */
  description: string
  payerOrgId: number
  payerOrgName: string
  payeeOrgId: number
  payeeOrgName: string
  amountMinor: number
  currency: string
  state: PaymentState
  /** The processor's hosted page, for the payer while the payment is pending; null otherwise. */
  checkoutUrl: string | null
  paymentIntentId: string | null
  refundId: string | null
  refundedMinor: number | null
  failureReason: string | null
  side: PaymentSide
  moves: PaymentAction[]
  succeededAt: string | null
  failedAt: string | null
  refundedAt: string | null
  createdAt: string
  updatedAt: string
}

export interface PaymentEvent {
  id: number
  action: 'created' | 'succeeded' | 'failed' | 'refunded'
  fromState: PaymentState | null
  toState: PaymentState
  /** False for an event that came too late to change anything (a failure after the payment succeeded). */
  applied: boolean
  byName: string
  note: string | null
  createdAt: string
}

export interface PaymentDetail extends Payment {
  history: PaymentEvent[]
}

export interface PaymentList { items: Payment[], total: number }

/** Something owed that has no live payment yet: a deposit, a balance or a settlement to pay. */
export interface PaymentDue extends Pick<Payment, 'purpose' | 'treeContractId' | 'deliveryId' | 'description' | 'payerOrgId'
  | 'payerOrgName' | 'payeeOrgId' | 'payeeOrgName' | 'amountMinor' | 'currency' | 'side'> {
  /** The payment that failed last, when one did. */
  lastFailedPaymentId: number | null
}

export interface PaymentDueList { items: PaymentDue[], total: number }
