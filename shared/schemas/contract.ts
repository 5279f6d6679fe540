import { z } from 'zod'
import { DELIVERY_SEASONS, TREE_TYPES } from '../utils/backplan'
import { FRUIT_CONTRACT_STATES, TREE_CONTRACT_STATES } from '../utils/contractStatus'
import { FORECAST_CLASSES } from '../utils/forecast'
import { JUICE_CLASSES } from '../utils/juiceClass'
import { isoDate, minorUnits, numberInRange, optionalText, pageQuerySchema, somethingToChange, withDecimals, writableObject } from './fields'
import { CURRENCIES } from './organisation'

// The bodies of tree and fruit contracts. Terms are the fields an offer or a counter may change;
// the parties are named when a draft is made and never change after. A client may send back what
// it read (ids, state, version, computed figures): those keys are dropped, any other unknown key
// is refused by name.

export const CONTRACT_LIMITS = {
  trees: { min: 1, max: 1_000_000 },
  caliperMm: { min: 5, max: 60 },
  unitPriceMinor: 10_000_000,
  tonnePriceMinor: 100_000_000,
  rate: { min: 0.01, max: 1 },
  pct: { min: 0, max: 100 },
  tolerancePct: { min: 0, max: 50 },
  brix: { min: 4, max: 30 },
  /** Delivery and harvest years from this year to this many years ahead. */
  yearsAhead: 15,
  scheduleYears: 15,
  tonnes: { min: 0.001, max: 100_000 },
  siteLength: 200,
  notesLength: 4000,
  reasonLength: 500,
} as const

/** What happens to a tree contract's deposit when the buyer cancels. */
export const DEPOSIT_IF_BUYER_CANCELS = ['kept', 'refunded'] as const
export type DepositIfBuyerCancels = typeof DEPOSIT_IF_BUYER_CANCELS[number]
/** …and when the nursery cancels: refunded, or refunded with as much again. */
export const DEPOSIT_IF_NURSERY_CANCELS = ['refunded', 'doubled'] as const
export type DepositIfNurseryCancels = typeof DEPOSIT_IF_NURSERY_CANCELS[number]
/** The last state of an accepted tree contract in which the buyer may still cancel it. */
export const BUYER_CANCEL_UNTIL = ['accepted', 'propagating', 'ready'] as const
export type BuyerCancelUntil = typeof BUYER_CANCEL_UNTIL[number]
/** What a crop failure does to a year's shortfall. */
export const CROP_FAILURE_TERMS = ['forgiven', 'carried', 'owed'] as const
export type CropFailureTerm = typeof CROP_FAILURE_TERMS[number]

/** Keys a client reads and may send back; a body's copy of them is ignored. */
export const CONTRACT_READ_ONLY_KEYS = [
  'id', 'state', 'version', 'acceptedVersion', 'draftedBy', 'lastOfferBy', 'cancelledBy', 'expired', 'side', 'moves',
  'createdAt', 'updatedAt', 'createdByUserId', 'buyerOrgName', 'nurseryOrgName', 'makerOrgName', 'growerOrgName',
  'varietyName', 'varietySpecies', 'rootstockDesignation', 'rootstockNeedsSupport', 'money', 'backPlan', 'fruitClass',
  'totalTonnes', 'settlementExamples', 'coverageWarning', 'deliveredCount', 'deliveredOn', 'awaiting',
] as const

const thisYear = () => new Date().getUTCFullYear()

function aheadYear(what: string) {
  return z.number({ message: `Enter the ${what}` }).int({ message: `Enter a whole year for the ${what}` }).superRefine((year, ctx) => {
    const from = thisYear()
    const to = from + CONTRACT_LIMITS.yearsAhead
    if (year < from || year > to) ctx.addIssue({ code: 'custom', message: `Enter a year from ${from} to ${to}` })
  })
}

function catalogueId(what: string) {
  return z.number({ message: `Choose a ${what}` }).int({ message: `Choose a ${what}` }).positive({ message: `Choose a ${what}` })
}

function orgId(what: string) {
  return z.number({ message: `Choose the ${what}` }).int({ message: `Choose the ${what}` }).positive({ message: `Choose the ${what}` })
}

const pct = (message: string) => withDecimals(numberInRange(CONTRACT_LIMITS.pct, message), 2, 'Use at most 2 decimals')
const rate = (message: string) => withDecimals(numberInRange(CONTRACT_LIMITS.rate, message), 3, 'Use at most 3 decimals')
const brix = (message: string) => withDecimals(numberInRange(CONTRACT_LIMITS.brix, message), 1, 'Give °Brix to 0.1')

const expiresOn = isoDate('Enter the last day the offer may be accepted as YYYY-MM-DD, or leave it empty').nullable()

// ----- Tree contracts -----

export const treeTermsFields = {
  varietyId: catalogueId('variety'),
  rootstockId: catalogueId('rootstock'),
  /** Worked between rootstock and variety (a compatible pear over quince, M.9 on a vigorous stock); null when none. */
  interstem: optionalText('Enter the interstem as text', 80),
  treeCount: z.number({ message: 'Enter the number of trees' }).int({ message: 'Enter a whole number of trees' })
    .min(CONTRACT_LIMITS.trees.min, { message: 'Enter from 1 to 1,000,000 trees' }).max(CONTRACT_LIMITS.trees.max, { message: 'Enter from 1 to 1,000,000 trees' }),
  treeType: z.enum(TREE_TYPES, { message: `Choose a tree type: ${TREE_TYPES.join(', ')}` }),
  minCaliperMm: withDecimals(numberInRange(CONTRACT_LIMITS.caliperMm, 'Enter a trunk caliper from 5 to 60 mm, or leave it empty'), 1, 'Give the caliper to 0.1 mm').nullable(),
  deliveryYear: aheadYear('delivery year'),
  deliverySeason: z.enum(DELIVERY_SEASONS, { message: 'Choose autumn or spring delivery' }),
  currency: z.enum(CURRENCIES, { message: `Choose one of ${CURRENCIES.join(', ')}` }),
  unitPriceMinor: minorUnits('the price per tree', CONTRACT_LIMITS.unitPriceMinor),
  royaltyPerTreeMinor: minorUnits('the rootstock royalty per tree', CONTRACT_LIMITS.unitPriceMinor),
  depositPct: pct('Enter a deposit from 0 to 100 % of the contract'),
  depositIfBuyerCancels: z.enum(DEPOSIT_IF_BUYER_CANCELS, { message: 'Say whether the deposit is kept or refunded if the buyer cancels' }),
  depositIfNurseryCancels: z.enum(DEPOSIT_IF_NURSERY_CANCELS, { message: 'Say whether the deposit is refunded or doubled if the nursery cancels' }),
  buyerMayCancelUntil: z.enum(BUYER_CANCEL_UNTIL, { message: 'Say until when the buyer may cancel: accepted, propagating or ready' }),
  certificateRequired: z.boolean({ message: 'Say whether a plant-health certificate is required' }),
  takeRate: rate('Enter the expected take from 0.01 to 1 (0.85 = 85 % of buds take)'),
  survivalRate: rate('Enter the expected survival from 0.01 to 1 (0.9 = 90 % of taken trees reach sale)'),
  plantingSite: optionalText('Enter the planting site as text', CONTRACT_LIMITS.siteLength),
  notes: optionalText('Notes must be text', CONTRACT_LIMITS.notesLength),
  expiresOn,
}
export type TreeTerms = { [K in keyof typeof treeTermsFields]: z.output<typeof treeTermsFields[K]> }
export type TreeTermField = keyof TreeTerms

/** Defaults a draft takes for terms it does not give (the currency defaults to the drafter's own). */
export const TREE_TERM_DEFAULTS = {
  interstem: null, treeType: 'maiden', minCaliperMm: null, royaltyPerTreeMinor: 0, depositPct: 0,
  depositIfBuyerCancels: 'kept', depositIfNurseryCancels: 'refunded', buyerMayCancelUntil: 'accepted',
  certificateRequired: false, takeRate: 0.85, survivalRate: 0.9, plantingSite: null, notes: null, expiresOn: null,
} as const satisfies Partial<TreeTerms>

export const treeContractCreateSchema = writableObject({
  ...treeTermsFields,
  interstem: treeTermsFields.interstem.optional(),
  treeType: treeTermsFields.treeType.optional(),
  minCaliperMm: treeTermsFields.minCaliperMm.optional(),
  currency: treeTermsFields.currency.optional(),
  royaltyPerTreeMinor: treeTermsFields.royaltyPerTreeMinor.optional(),
  depositPct: treeTermsFields.depositPct.optional(),
  depositIfBuyerCancels: treeTermsFields.depositIfBuyerCancels.optional(),
  depositIfNurseryCancels: treeTermsFields.depositIfNurseryCancels.optional(),
  buyerMayCancelUntil: treeTermsFields.buyerMayCancelUntil.optional(),
  certificateRequired: treeTermsFields.certificateRequired.optional(),
  takeRate: treeTermsFields.takeRate.optional(),
  survivalRate: treeTermsFields.survivalRate.optional(),
  plantingSite: treeTermsFields.plantingSite.optional(),
  notes: treeTermsFields.notes.optional(),
  expiresOn: treeTermsFields.expiresOn.optional(),
  /** One of the two is the drafter's own organisation (and may be left out). */
  buyerOrgId: orgId('buyer').optional(),
  nurseryOrgId: orgId('nursery').optional(),
}, CONTRACT_READ_ONLY_KEYS)
export type TreeContractCreateInput = z.output<typeof treeContractCreateSchema>

/** A draft's edit or a counter-offer: any terms; the parties are fixed and ignored if sent back. */
export const treeTermsPatchSchema = writableObject(
  Object.fromEntries(Object.entries(treeTermsFields).map(([k, v]) => [k, v.optional()])) as { [K in TreeTermField]: z.ZodOptional<typeof treeTermsFields[K]> },
  [...CONTRACT_READ_ONLY_KEYS, 'buyerOrgId', 'nurseryOrgId'],
).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['treeCount'] })
export type TreeTermsPatch = Partial<TreeTerms>

export const treeDeliverSchema = writableObject({
  deliveredCount: z.number({ message: 'Enter the number of trees delivered' }).int({ message: 'Enter a whole number of trees' })
    .min(1, { message: 'Enter at least 1 tree delivered' }).max(CONTRACT_LIMITS.trees.max, { message: 'Enter at most 1,000,000 trees' }),
  deliveredOn: isoDate('Enter the delivery date as YYYY-MM-DD'),
}, CONTRACT_READ_ONLY_KEYS.filter(k => k !== 'deliveredCount' && k !== 'deliveredOn'))
export type TreeDeliverInput = z.output<typeof treeDeliverSchema>

export const treeContractListQuerySchema = pageQuerySchema.extend({
  state: z.preprocess(v => (v === '' ? undefined : v), z.enum(TREE_CONTRACT_STATES, { message: `Filter by one of ${TREE_CONTRACT_STATES.join(', ')}` }).optional()),
  counterpartyId: z.preprocess(v => (v === '' ? undefined : v), z.coerce.number().int().positive({ message: 'Not a valid organisation id' }).optional()),
  year: z.preprocess(v => (v === '' ? undefined : v), z.coerce.number().int().min(1900, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }).optional()),
})
export type TreeContractListQuery = z.output<typeof treeContractListQuerySchema>

// ----- Fruit contracts -----

const scheduleYear = z.strictObject({
  year: aheadYear('harvest year'),
  tonnes: withDecimals(numberInRange(CONTRACT_LIMITS.tonnes, 'Enter from 0.001 to 100,000 tonnes'), 3, 'Give tonnes to 1 kg (3 decimals)'),
  windowFrom: isoDate('Enter the first delivery day as YYYY-MM-DD'),
  windowTo: isoDate('Enter the last delivery day as YYYY-MM-DD'),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : undefined) }).superRefine((y, ctx) => {
  if (y.windowTo < y.windowFrom) ctx.addIssue({ code: 'custom', path: ['windowTo'], message: 'The window must end on or after its first day' })
  // A harvest's window falls in its year, or runs into the next (a late harvest, or the south).
  const from = Number(y.windowFrom.slice(0, 4))
  const to = Number(y.windowTo.slice(0, 4))
  if (from < y.year || from > y.year + 1) ctx.addIssue({ code: 'custom', path: ['windowFrom'], message: `The ${y.year} window must start in ${y.year} or ${y.year + 1}` })
  if (to > y.year + 1) ctx.addIssue({ code: 'custom', path: ['windowTo'], message: `The ${y.year} window must end by the end of ${y.year + 1}` })
})
export type ScheduleYearInput = z.output<typeof scheduleYear>

const schedule = z.array(scheduleYear, { message: 'Give the tonnes for each harvest year' })
  .min(1, { message: 'Give at least one harvest year' })
  .max(CONTRACT_LIMITS.scheduleYears, { message: `Give at most ${CONTRACT_LIMITS.scheduleYears} harvest years` })
  .superRefine((years, ctx) => {
    const seen = new Set<number>()
    years.forEach((y, i) => {
      if (seen.has(y.year)) ctx.addIssue({ code: 'custom', path: [i, 'year'], message: `${y.year} is given twice` })
      seen.add(y.year)
    })
  })

export const fruitTermsFields = {
  /** One variety, or else a juice class of a species. */
  varietyId: catalogueId('variety').nullable(),
  species: z.enum(['apple', 'pear'], { message: 'Choose apple or pear' }).nullable(),
  juiceClass: z.enum(JUICE_CLASSES, { message: `Choose a juice class: ${JUICE_CLASSES.join(', ')}` }).nullable(),
  schedule,
  tolerancePct: pct('Enter a tolerance from 0 to 50 %').refine(v => v <= CONTRACT_LIMITS.tolerancePct.max, { message: 'Enter a tolerance from 0 to 50 %' }),
  currency: z.enum(CURRENCIES, { message: `Choose one of ${CURRENCIES.join(', ')}` }),
  basePricePerTonneMinor: minorUnits('the base price per tonne', CONTRACT_LIMITS.tonnePriceMinor),
  baselineBrix: brix('Enter a sugar baseline from 4 to 30 °Brix'),
  bonusPerBrixPerTonneMinor: minorUnits('the bonus per tonne per °Brix', CONTRACT_LIMITS.tonnePriceMinor),
  deductionPerBrixPerTonneMinor: minorUnits('the deduction per tonne per °Brix', CONTRACT_LIMITS.tonnePriceMinor),
  rejectFloorBrix: brix('Enter a reject floor from 4 to 30 °Brix'),
  maxRotPct: pct('Enter the most rot accepted, 0 to 100 %, or leave it empty').nullable(),
  maxDamagePct: pct('Enter the most damage accepted, 0 to 100 %, or leave it empty').nullable(),
  cropFailure: z.enum(CROP_FAILURE_TERMS, { message: 'Say whether a shortfall after crop failure is forgiven, carried to next year or owed' }),
  notes: optionalText('Notes must be text', CONTRACT_LIMITS.notesLength),
  expiresOn,
}
export type FruitTerms = { [K in keyof typeof fruitTermsFields]: z.output<typeof fruitTermsFields[K]> }
export type FruitTermField = keyof FruitTerms

export const FRUIT_TERM_DEFAULTS = {
  varietyId: null, species: null, juiceClass: null, tolerancePct: 10, bonusPerBrixPerTonneMinor: 0, deductionPerBrixPerTonneMinor: 0,
  maxRotPct: null, maxDamagePct: null, cropFailure: 'forgiven', notes: null, expiresOn: null,
} as const satisfies Partial<FruitTerms>

/**
 * The checks that span fields, on the terms as they will stand (after defaults, or a patch laid
 * over the current terms): what the fruit is, and a reject floor at or below the baseline.
 */
export function fruitTermsIssues(t: Pick<FruitTerms, 'varietyId' | 'species' | 'juiceClass' | 'baselineBrix' | 'rejectFloorBrix'>): { path: string, message: string }[] {
  const issues: { path: string, message: string }[] = []
  if (t.varietyId === null && (t.species === null || t.juiceClass === null)) {
    issues.push({ path: t.juiceClass === null ? 'juiceClass' : 'species', message: 'Choose one variety, or a species and a juice class' })
  }
  if (t.varietyId !== null && t.juiceClass !== null) {
    issues.push({ path: 'juiceClass', message: 'A contract for one variety takes its juice class from the catalogue: leave the class empty' })
  }
  if (t.rejectFloorBrix > t.baselineBrix) {
    issues.push({ path: 'rejectFloorBrix', message: `The reject floor must be at or below the sugar baseline (${t.baselineBrix} °Brix)` })
  }
  return issues
}

export const fruitContractCreateSchema = writableObject({
  ...fruitTermsFields,
  varietyId: fruitTermsFields.varietyId.optional(),
  species: fruitTermsFields.species.optional(),
  juiceClass: fruitTermsFields.juiceClass.optional(),
  tolerancePct: fruitTermsFields.tolerancePct.optional(),
  currency: fruitTermsFields.currency.optional(),
  bonusPerBrixPerTonneMinor: fruitTermsFields.bonusPerBrixPerTonneMinor.optional(),
  deductionPerBrixPerTonneMinor: fruitTermsFields.deductionPerBrixPerTonneMinor.optional(),
  maxRotPct: fruitTermsFields.maxRotPct.optional(),
  maxDamagePct: fruitTermsFields.maxDamagePct.optional(),
  cropFailure: fruitTermsFields.cropFailure.optional(),
  notes: fruitTermsFields.notes.optional(),
  expiresOn: fruitTermsFields.expiresOn.optional(),
  makerOrgId: orgId('cider or perry maker').optional(),
  growerOrgId: orgId('grower').optional(),
}, CONTRACT_READ_ONLY_KEYS)
export type FruitContractCreateInput = z.output<typeof fruitContractCreateSchema>

export const fruitTermsPatchSchema = writableObject(
  Object.fromEntries(Object.entries(fruitTermsFields).map(([k, v]) => [k, v.optional()])) as { [K in FruitTermField]: z.ZodOptional<typeof fruitTermsFields[K]> },
  [...CONTRACT_READ_ONLY_KEYS, 'makerOrgId', 'growerOrgId'],
).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['schedule'] })
export type FruitTermsPatch = Partial<FruitTerms>

export const fruitContractListQuerySchema = treeContractListQuerySchema.extend({
  state: z.preprocess(v => (v === '' ? undefined : v), z.enum(FRUIT_CONTRACT_STATES, { message: `Filter by one of ${FRUIT_CONTRACT_STATES.join(', ')}` }).optional()),
})
export type FruitContractListQuery = z.output<typeof fruitContractListQuerySchema>

// ----- Moves -----

export const acceptSchema = writableObject({
  version: z.number({ message: 'Name the version you accept' }).int({ message: 'Name the version you accept' }).positive({ message: 'Name the version you accept' }),
}, CONTRACT_READ_ONLY_KEYS.filter(k => k !== 'version'))

/** offer, decline, cancel, start-propagation, mark-ready: an optional note for the other side. */
export const moveNoteSchema = writableObject({
  reason: optionalText('Enter the reason as text', CONTRACT_LIMITS.reasonLength).optional(),
}, CONTRACT_READ_ONLY_KEYS)

// ----- A maker's needs -----

export const needRowSchema = z.strictObject({
  juiceClass: z.enum(FORECAST_CLASSES, { message: `Choose a juice class: ${FORECAST_CLASSES.join(', ')}` }),
  year: z.number({ message: 'Enter the harvest year' }).int({ message: 'Enter a whole year' }).min(1900, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }),
  kg: withDecimals(numberInRange({ min: 0, max: 100_000_000 }, 'Enter from 0 to 100,000,000 kg'), 1, 'Give kg to 0.1'),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : undefined) })

/** `PUT /api/needs` replaces the whole table. */
export const needsPutSchema = writableObject({
  items: z.array(needRowSchema, { message: 'Send the needs as a list of { juiceClass, year, kg }' }).max(600, { message: 'Send at most 600 rows' })
    .superRefine((rows, ctx) => {
      const seen = new Set<string>()
      rows.forEach((r, i) => {
        const key = `${r.juiceClass}:${r.year}`
        if (seen.has(key)) ctx.addIssue({ code: 'custom', path: [i, 'year'], message: `${r.juiceClass} ${r.year} is given twice` })
        seen.add(key)
      })
    }),
}, ['total'])
export type NeedsPutInput = z.output<typeof needsPutSchema>
