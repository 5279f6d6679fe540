import type { BuyerCancelUntil, CropFailureTerm, DepositIfBuyerCancels, DepositIfNurseryCancels, FruitTermField, TreeTermField } from '../schemas/contract'
import type { DeliverySeason, PropagationStep, TreeType } from './backplan'
import type { ContractKind, FruitContractState, TreeContractState } from './contractStatus'
import type { FruitSpecies, JuiceClass } from './juiceClass'

// How contracts read to a person: money in the contract's currency, terms and moves in plain
// words, and what changed between two versions. Every currency Pomewright trades in has two-decimal
// minor units (see CURRENCIES), so a sum is minor ÷ 100 in major units.

const MINOR_PER_MAJOR = 100

/** Integer minor units as the currency's own sum: 123450 GBP → "£1,234.50". */
export function formatContractMoney(minor: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(minor / MINOR_PER_MAJOR)
}

const MAJOR_TEXT = /^\d+(\.\d+)?$/
const GROUPED_MAJOR_TEXT = /^\d{1,3}(,\d{3})+(\.\d+)?$/

/**
 * A sum typed in major units ("4.20", "1,250") as integer minor units. Empty is undefined (not
 * given); anything that is not a sum to the minor unit is NaN, which the schema refuses. Worked on
 * the digits, so 4.1 is 410 and never 409.99….
 */
export function minorFromMajorText(text: string | number): number | undefined {
  let typed = String(text).trim()
  if (typed === '') return undefined
  if (GROUPED_MAJOR_TEXT.test(typed)) typed = typed.replace(/,/g, '')
  if (!MAJOR_TEXT.test(typed)) return Number.NaN
  const [whole = '0', fraction = ''] = typed.split('.')
  if (fraction.length > 2) return Number.NaN
  return Number(whole) * MINOR_PER_MAJOR + Number(fraction.padEnd(2, '0'))
}

/** Integer minor units as the text a person edits: 1250 → "12.50". */
export function majorTextFromMinor(minor: number): string {
  const whole = Math.floor(minor / MINOR_PER_MAJOR)
  return `${whole}.${String(minor - whole * MINOR_PER_MAJOR).padStart(2, '0')}`
}

/** A figure from a form box: empty is undefined (not given); anything else a number, NaN if it is not one. */
export function figureFromText(text: string | number): number | undefined {
  const typed = String(text).trim()
  return typed === '' ? undefined : Number(typed)
}

/** A figure that may be left out: empty is null. */
export function optionalFigureFromText(text: string | number): number | null {
  return figureFromText(text) ?? null
}

/** What a money field says when the sum typed is refused: in major units, which is what was typed. */
export function contractMoneyMessage(what: string, maxMinor: number, currency: string): string {
  return `Enter ${what} in ${currency}, from ${formatContractMoney(0, currency)} to ${formatContractMoney(maxMinor, currency)}, to two decimal places`
}

// ----- Words -----

export const CONTRACT_STATE_LABELS: Record<TreeContractState | FruitContractState, string> = {
  draft: 'Draft',
  offered: 'Offered',
  countered: 'Countered',
  accepted: 'Accepted',
  propagating: 'In propagation',
  ready: 'Trees ready',
  delivered: 'Delivered',
  fulfilled: 'Fulfilled',
  declined: 'Declined',
  cancelled: 'Cancelled',
}

export const TREE_TYPE_LABELS: Record<TreeType, string> = {
  'sleeping-eye': 'Sleeping eye (budded rootstock, bud still dormant)',
  'maiden': 'Maiden (one-year tree, unfeathered)',
  'feathered': 'Feathered maiden (one-year tree with side shoots)',
  'knip': 'Knip tree (two-year root, one-year top)',
  'bench-graft': 'Bench graft (grafted indoors in winter)',
}

export const DELIVERY_SEASON_LABELS: Record<DeliverySeason, string> = {
  autumn: 'Autumn, straight from digging',
  spring: 'Spring, for planting',
}

/** When the trees come: "Autumn 2028, straight from digging". */
export function treeDeliveryText(season: DeliverySeason, year: number): string {
  return season === 'autumn' ? `Autumn ${year}, straight from digging` : `Spring ${year}, for planting`
}

export const DEPOSIT_IF_BUYER_CANCELS_LABELS: Record<DepositIfBuyerCancels, string> = {
  kept: 'The nursery keeps it',
  refunded: 'Refunded to the buyer',
}

export const DEPOSIT_IF_NURSERY_CANCELS_LABELS: Record<DepositIfNurseryCancels, string> = {
  refunded: 'Refunded to the buyer',
  doubled: 'Refunded to the buyer with as much again',
}

export const BUYER_CANCEL_UNTIL_LABELS: Record<BuyerCancelUntil, string> = {
  accepted: 'Until propagation starts',
  propagating: 'Until the trees are ready',
  ready: 'Until the trees are delivered',
}

export const CROP_FAILURE_LABELS: Record<CropFailureTerm, string> = {
  forgiven: 'Forgiven',
  carried: 'Carried to the next harvest',
  owed: 'Owed by the grower',
}

export const PROPAGATION_STEP_LABELS: Record<PropagationStep, string> = {
  benchGrafted: 'Bench grafted indoors (late winter)',
  linersPlanted: 'Rootstock liners lined out',
  interstemBudded: 'Interstem budded onto the rootstock (late summer)',
  interstemHeadedBack: 'Headed back above the interstem bud (dormant)',
  budded: 'Budded with the variety (late summer)',
  headedBack: 'Headed back above the bud (dormant)',
  knipCutBack: 'One-year trees cut back to a short leader, the knip (dormant)',
  dug: 'Finished trees dug',
  delivered: 'Delivered to the buyer',
}

export const DEPOSIT_OUTCOME_LABELS: Record<'kept' | 'refunded' | 'doubled', string> = {
  kept: 'The nursery keeps the deposit',
  refunded: 'The deposit is refunded to the buyer',
  doubled: 'The deposit is refunded with as much again',
}

/** The terms of a tree contract, named as the history and the form name them. */
export const TREE_FIELD_LABELS: Record<TreeTermField, string> = {
  varietyId: 'Variety (scion)',
  rootstockId: 'Rootstock',
  interstem: 'Interstem',
  treeCount: 'Number of trees',
  treeType: 'Tree type',
  minCaliperMm: 'Least trunk caliper',
  deliveryYear: 'Delivery year',
  deliverySeason: 'Delivery season',
  currency: 'Currency',
  unitPriceMinor: 'Price per tree',
  royaltyPerTreeMinor: 'Rootstock royalty per tree',
  depositPct: 'Deposit',
  depositIfBuyerCancels: 'Deposit if the buyer cancels',
  depositIfNurseryCancels: 'Deposit if the nursery cancels',
  buyerMayCancelUntil: 'Buyer may cancel',
  certificateRequired: 'Plant-health certificate required',
  takeRate: 'Expected bud take',
  survivalRate: 'Expected survival to sale',
  plantingSite: 'Planting site',
  notes: 'Notes',
  expiresOn: 'Offer open until',
}

export const FRUIT_FIELD_LABELS: Record<FruitTermField, string> = {
  varietyId: 'Variety',
  species: 'Fruit',
  juiceClass: 'Juice class',
  schedule: 'Tonnes by harvest year',
  tolerancePct: 'Tonnage tolerance',
  currency: 'Currency',
  basePricePerTonneMinor: 'Base price per tonne',
  baselineBrix: 'Sugar baseline',
  bonusPerBrixPerTonneMinor: 'Bonus per °Brix above, per tonne',
  deductionPerBrixPerTonneMinor: 'Deduction per °Brix below, per tonne',
  rejectFloorBrix: 'Reject floor',
  maxRotPct: 'Most rot accepted',
  maxDamagePct: 'Most damage accepted',
  cropFailure: 'Shortfall after crop failure',
  notes: 'Notes',
  expiresOn: 'Offer open until',
}

export function contractFieldLabel(kind: ContractKind, field: string): string {
  const labels: Record<string, string> = kind === 'tree' ? TREE_FIELD_LABELS : FRUIT_FIELD_LABELS
  return labels[field] ?? field.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()
}

const HISTORY_ACTION_LABELS: Record<string, string> = {
  'created': 'Draft written',
  'edited': 'Draft edited',
  'offered': 'Offer sent',
  'countered': 'Counter-offer',
  'accepted': 'Accepted',
  'declined': 'Declined',
  'cancelled': 'Cancelled',
  'expired': 'Offer expired',
  'propagation-started': 'Propagation started',
  'marked-ready': 'Trees marked ready',
  'delivered': 'Delivery recorded',
  'fulfilled': 'Fulfilled: the last delivery window has closed',
}

/** A history entry's action in words: "countered" → "Counter-offer". */
export function contractHistoryLabel(action: string): string {
  const label = HISTORY_ACTION_LABELS[action]
  if (label) return label
  const words = action.replace(/[-_.]/g, ' ')
  return words.charAt(0).toUpperCase() + words.slice(1)
}

/** A date as people read it: 2027-11-30 → "30 November 2027". */
export function contractDate(iso: string): string {
  return new Date(`${iso.slice(0, 10)}T12:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
}

const plainNumber = (value: number, digits = 3) => new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits }).format(value)

/** What a fruit contract is for: one variety, or a juice class of apples or perry pears. */
export function fruitContractWhat(c: { varietyName: string | null, species: FruitSpecies | null, juiceClass: JuiceClass | null }): string {
  if (c.varietyName) return c.varietyName
  return `${c.juiceClass ?? 'any'} ${c.species === 'pear' ? 'perry pears' : 'apples'}`
}

export interface ContractValueContext {
  currency: string
  /** The catalogue name of a variety or rootstock id, where known. */
  catalogueName?: (field: 'varietyId' | 'rootstockId', id: number) => string | undefined
  /** Tonnes in the reader's units, e.g. "40 t" or "44.09 short ton". */
  tonnes?: (t: number) => string
}

interface ScheduleLine { year: number, tonnes: number, windowFrom: string, windowTo: string }

const ENUM_LABELS: Record<string, Record<string, string>> = {
  treeType: TREE_TYPE_LABELS,
  deliverySeason: DELIVERY_SEASON_LABELS,
  depositIfBuyerCancels: DEPOSIT_IF_BUYER_CANCELS_LABELS,
  depositIfNurseryCancels: DEPOSIT_IF_NURSERY_CANCELS_LABELS,
  buyerMayCancelUntil: BUYER_CANCEL_UNTIL_LABELS,
  cropFailure: CROP_FAILURE_LABELS,
}

function scheduleText(lines: ScheduleLine[], tonnes: (t: number) => string): string {
  return [...lines].sort((a, b) => a.year - b.year)
    .map(l => `${l.year}: ${tonnes(l.tonnes)}, ${contractDate(l.windowFrom)} to ${contractDate(l.windowTo)}`)
    .join('; ')
}

/** One term's value as a person reads it, for the history's "from → to". */
export function contractValueText(field: string, value: unknown, context: ContractValueContext): string {
  if (value === null || value === undefined || value === '') return 'none'
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  if (field === 'schedule' && Array.isArray(value)) return scheduleText(value as ScheduleLine[], context.tonnes ?? (t => `${plainNumber(t)} t`))
  if (typeof value === 'number') {
    if (field.endsWith('Minor')) return formatContractMoney(value, context.currency)
    if (field === 'varietyId' || field === 'rootstockId') return context.catalogueName?.(field, value) ?? `catalogue entry ${value}`
    if (field === 'takeRate' || field === 'survivalRate') return `${plainNumber(value * 100, 1)} %`
    if (field.endsWith('Pct')) return `${plainNumber(value, 2)} %`
    if (field.endsWith('Brix')) return `${plainNumber(value, 1)} °Brix`
    if (field === 'minCaliperMm') return `${plainNumber(value, 1)} mm`
    if (field.endsWith('Year')) return String(value)
    return plainNumber(value)
  }
  if (typeof value === 'string') {
    if (field === 'expiresOn' || field.endsWith('On')) return contractDate(value)
    return ENUM_LABELS[field]?.[value] ?? value
  }
  return JSON.stringify(value)
}

/** A value in one canonical text, object keys sorted, so that a schedule read back compares equal to one typed. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map(k => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`).join(',')}}`
  }
  return JSON.stringify(value ?? null)
}

/**
 * The terms that differ from those in place: what a counter-offer or a draft's edit sends, so the
 * history shows exactly what was changed. Only the keys of `terms` are compared.
 */
export function contractTermChanges<T extends Record<string, unknown>>(terms: T, current: Record<string, unknown>): Partial<T> {
  return Object.fromEntries(Object.entries(terms).filter(([key, value]) => canonical(value) !== canonical(current[key]))) as Partial<T>
}
