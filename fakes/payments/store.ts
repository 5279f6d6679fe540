import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'

// What the fake processor remembers, kept in one JSON file under its data folder so a restart of
// the fakes (or of `npm start`) finds the same accounts, sessions and refunds.

export interface FakeAccount { id: string, object: 'account', type: string, country: string, email: string | null, metadata: Record<string, string>, created: number }

export interface FakeSession {
  id: string
  object: 'checkout.session'
  mode: 'payment'
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  /** The product line the payer sees on the hosted page. */
  description: string
  destination: string
  success_url: string
  cancel_url: string
  url: string
  metadata: Record<string, string>
  payment_intent: string | null
  created: number
}

export interface FakePaymentIntent {
  id: string
  object: 'payment_intent'
  amount: number
  currency: string
  status: 'requires_payment_method' | 'succeeded'
  metadata: Record<string, string>
  latest_charge: string | null
  transfer_data: { destination: string }
  created: number
}

export interface FakeRefund { id: string, object: 'refund', amount: number, currency: string, payment_intent: string, charge: string, status: 'succeeded', metadata: Record<string, string>, created: number }

export interface FakeState {
  accounts: Record<string, FakeAccount>
  sessions: Record<string, FakeSession>
  paymentIntents: Record<string, FakePaymentIntent>
  refunds: Record<string, FakeRefund>
  /** Idempotency key → the answer first given to it, as the processor replays it. */
  idempotent: Record<string, { status: number, body: unknown }>
  counter: number
}

const EMPTY: FakeState = { accounts: {}, sessions: {}, paymentIntents: {}, refunds: {}, idempotent: {}, counter: 0 }

export class FakeStore {
  readonly state: FakeState
  private readonly file: string

  constructor(dir: string) {
    mkdirSync(dir, { recursive: true })
    this.file = join(dir, 'state.json')
    this.state = existsSync(this.file) ? { ...EMPTY, ...JSON.parse(readFileSync(this.file, 'utf8')) as FakeState } : structuredClone(EMPTY)
  }

  /** A new id with the processor's prefix (`acct_`, `cs_test_`, `pi_`, `ch_`, `re_`, `evt_`). */
  nextId(prefix: string): string {
    this.state.counter += 1
    return `${prefix}${Date.now().toString(36)}${this.state.counter.toString(36).padStart(4, '0')}`
  }

  /** Written whole to a temporary file and renamed over the old one, so a crash never leaves half a file. */
  save(): void {
    writeFileSync(`${this.file}.tmp`, JSON.stringify(this.state))
    renameSync(`${this.file}.tmp`, this.file)
  }
}

export const now = () => Math.floor(Date.now() / 1000)
