import type { FruitTerms, TreeTerms } from '../../../../shared/schemas/contract'
import type { ForecastClass } from '../../../../shared/utils/forecast'

// The contracts of the invented Estry valley, as data: who drafted each, the terms it was first
// offered on, and the moves since, in order. The seed replays the moves through the app's own move
// table, so each contract's state, version and history come out as the app would have left them.

export const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
export const TANSY_ROW = 'Tansy Row Fruit'
export const QUILLHURST = 'Quillhurst Cider Works'
export const MARROWBY = 'Marrowby Perry House'

/** The owner who speaks for each organisation in the demo. */
export const DEMO_OWNERS: Record<string, string> = {
  [QUILLHURST]: 'maker@demo.test',
  [HOLLOWMERE]: 'grower@demo.test',
  [TANSY_ROW]: 'grower2@demo.test',
}

export interface DemoBlock {
  org: string
  name: string
  variety: string
  rootstock: string
  treeCount: number
  yearPlanted: number
  areaHa: number
  inRowM: number
  betweenRowM: number
  organicStatus: 'conventional' | 'in_conversion' | 'organic'
  survivalRate: number
  notes: string | null
}

// Blocks planted in the last four years, so the forecasts climb instead of running flat. Tree
// counts sit a little under what the spacing allows (trees per ha = 10,000 / (in-row × between-row)).
export const YOUNG_BLOCKS: DemoBlock[] = [
  { org: TANSY_ROW, name: 'Mill Leat', variety: 'Kingston Black', rootstock: 'G.41', treeCount: 1800, yearPlanted: 2025, areaHa: 0.7, inRowM: 1.1, betweenRowM: 3.5, organicStatus: 'conventional', survivalRate: 0.98, notes: 'Post-and-wire trellis like Top Flats; a few trees lost to voles the first winter.' },
  { org: TANSY_ROW, name: 'Ferry Piece', variety: 'Foxwhelp', rootstock: 'M.26', treeCount: 700, yearPlanted: 2026, areaHa: 0.75, inRowM: 2.4, betweenRowM: 4.3, organicStatus: 'in_conversion', survivalRate: 0.99, notes: 'Planted this spring; staked and guarded.' },
  { org: HOLLOWMERE, name: 'Stackyard', variety: 'Dabinett', rootstock: 'MM.106', treeCount: 400, yearPlanted: 2023, areaHa: 1.0, inRowM: 4.3, betweenRowM: 5.5, organicStatus: 'conventional', survivalRate: 0.98, notes: 'Budded from Long Ground; these trees will carry the nursery\'s Dabinett budwood.' },
]

/** A move after the draft: an offer by the drafter, an answer by the side whose turn it is, the nursery's work by the nursery. */
export type DemoMove<T>
  = | { action: 'offered', at: string }
    | { action: 'countered', at: string, change: Partial<T>, reason: string }
    | { action: 'accepted', at: string }
    | { action: 'propagation-started', at: string, by: 'nursery', reason: string }

interface DemoContract<T, Side extends string> {
  draftedBy: Side
  /** The terms as the draft was first offered (version 1). */
  terms: T
  createdAt: string
  moves: DemoMove<T>[]
}

/** Tree terms with the catalogue named instead of by id. */
export type DemoTreeTerms = Omit<TreeTerms, 'varietyId' | 'rootstockId'> & { variety: string, rootstock: string }

export interface DemoTreeContract extends DemoContract<DemoTreeTerms, 'buyer' | 'nursery'> {
  buyer: string
  nursery: string
}

export interface DemoFruitContract extends DemoContract<FruitTerms, 'maker' | 'grower'> {
  maker: string
  grower: string
}

// Quillhurst's new orchard is planted in two phases on its own ground; the trees are budded to
// order at Hollowmere. MM.106 is an old Malling-Merton stock, so no rootstock royalty is due.
const KILN_FIELD = 'Kiln Field, Quillhurst Cider Works (new orchard)'
const TREE_TERMS = {
  interstem: null, treeType: 'maiden', minCaliperMm: 12, currency: 'GBP', royaltyPerTreeMinor: 0, depositPct: 20,
  depositIfBuyerCancels: 'kept', depositIfNurseryCancels: 'refunded', buyerMayCancelUntil: 'accepted',
  certificateRequired: true, takeRate: 0.85, survivalRate: 0.9, plantingSite: KILN_FIELD, expiresOn: null,
} as const satisfies Partial<DemoTreeTerms>

export const TREE_CONTRACTS: DemoTreeContract[] = [
  {
    // Accepted in July, so the rootstocks could be budded in August (the nursery's season); now
    // in propagation.
    buyer: QUILLHURST, nursery: HOLLOWMERE, draftedBy: 'buyer', createdAt: '2026-06-29T09:10:00Z',
    terms: { ...TREE_TERMS, variety: 'Dabinett', rootstock: 'MM.106', treeCount: 1200, deliveryYear: 2028, deliverySeason: 'spring', unitPriceMinor: 1350, notes: 'Kiln Field, first phase: bush trees for a grassed orchard, delivered bare-root.' },
    moves: [
      { action: 'offered', at: '2026-06-30T08:45:00Z' },
      { action: 'countered', at: '2026-07-08T17:20:00Z', change: { unitPriceMinor: 1450 }, reason: 'MM.106 liners cost more this year; at £14.50 a tree we can bud all 1,200 this August.' },
      { action: 'accepted', at: '2026-07-14T11:05:00Z' },
      { action: 'propagation-started', at: '2026-08-20T16:00:00Z', by: 'nursery', reason: 'Budded this week on the MM.106 liners lined out in April, with spares for the losses.' },
    ],
  },
  {
    buyer: QUILLHURST, nursery: HOLLOWMERE, draftedBy: 'buyer', createdAt: '2026-10-12T10:30:00Z',
    terms: { ...TREE_TERMS, variety: 'Kingston Black', rootstock: 'MM.106', treeCount: 600, deliveryYear: 2029, deliverySeason: 'autumn', unitPriceMinor: 1500, buyerMayCancelUntil: 'propagating', notes: 'Kiln Field, second phase.' },
    moves: [
      { action: 'offered', at: '2026-10-13T09:00:00Z' },
      { action: 'accepted', at: '2026-10-27T15:40:00Z' },
    ],
  },
  {
    buyer: QUILLHURST, nursery: HOLLOWMERE, draftedBy: 'buyer', createdAt: '2026-11-09T14:00:00Z',
    terms: { ...TREE_TERMS, variety: 'Yarlington Mill', rootstock: 'MM.106', treeCount: 900, deliveryYear: 2030, deliverySeason: 'spring', unitPriceMinor: 1450, notes: 'Kiln Field, third phase: bittersweet to go with the Dabinett.' },
    moves: [
      { action: 'offered', at: '2026-11-10T08:30:00Z' },
      { action: 'countered', at: '2026-11-24T16:15:00Z', change: { unitPriceMinor: 1600, expiresOn: '2027-01-15' }, reason: 'Yarlington Mill budwood is short until Chapel Piece is reworked: £16.00 a tree, open until 15 January.' },
    ],
  },
]

const window = (year: number) => ({ year, windowFrom: `${year}-10-01`, windowTo: `${year}-11-15` })

// Tansy Row's bittersharp forecast (apple, kg), worked with the app's own modules
// (server/utils/bearingCurve.ts on the catalogue's rootstocks at the middle pace, then
// shared/utils/forecast.ts sumForecastByClass over its five blocks as seeded, young ones included):
//   2026  76,585.2   River Strip 33,465 + Osier Bed 17,875.2 + Top Flats 25,245
//   2027  93,676.5   Osier Bed full (22,344), Top Flats 3/4 (37,867.5)
//   2028 115,119.0   Top Flats full (50,490), Mill Leat first crop 1/4 (8,820)
//   2029 128,097.0   Mill Leat 2/4 (17,640), Ferry Piece first crop 1/5 (4,158)
//   2030 141,075.0   Mill Leat 3/4 (26,460), Ferry Piece 2/5 (8,316)
// With 10 % tolerance a year is over-committed when its tonnes × 0.9 exceed the forecast. 2027's
// 110 t needs at least 99 t against 93.7 t forecast: 5.3 t short, so the warning shows. The other
// years ask 52 %, 43 %, 43 % and 43 % of the forecast.
export const FRUIT_CONTRACT: DemoFruitContract = {
  maker: QUILLHURST, grower: TANSY_ROW, draftedBy: 'maker', createdAt: '2026-09-01T10:00:00Z',
  terms: {
    varietyId: null, species: 'apple', juiceClass: 'bittersharp',
    schedule: [
      { ...window(2026), tonnes: 40 },
      { ...window(2027), tonnes: 110 },
      { ...window(2028), tonnes: 50 },
      { ...window(2029), tonnes: 55 },
      { ...window(2030), tonnes: 60 },
    ],
    tolerancePct: 10, currency: 'GBP', basePricePerTonneMinor: 21000, baselineBrix: 12.0,
    bonusPerBrixPerTonneMinor: 1000, deductionPerBrixPerTonneMinor: 1500, rejectFloorBrix: 9.5,
    maxRotPct: 5, maxDamagePct: 10, cropFailure: 'carried',
    notes: '2027 carries the extra fruit for Quillhurst\'s single-class bittersharp pressing; the other years are its blend share.',
    expiresOn: null,
  },
  moves: [
    { action: 'offered', at: '2026-09-02T09:15:00Z' },
    { action: 'accepted', at: '2026-09-15T18:30:00Z' },
  ],
}

// Quillhurst presses about 120 t a season for a medium-dry base: bittersweet the backbone,
// bittersharp and sharp for acid and lift (the shares are the demo's, not a recipe). Its plans
// grow a little each year; the Kiln Field trees come into bearing only in the 2030s.
const NEED_START: Partial<Record<ForecastClass, { kg: number, risePerYearKg: number }>> = {
  bittersweet: { kg: 60_000, risePerYearKg: 800 },
  bittersharp: { kg: 36_000, risePerYearKg: 400 },
  sharp: { kg: 24_000, risePerYearKg: 300 },
}

export const QUILLHURST_NEEDS: { juiceClass: ForecastClass, year: number, kg: number }[] = Object.entries(NEED_START)
  .flatMap(([juiceClass, need]) => Array.from({ length: 10 }, (_, i) => ({ juiceClass: juiceClass as ForecastClass, year: 2027 + i, kg: need!.kg + i * need!.risePerYearKg })))

/**
 * The moves whose notices the demo shows (each tree contract named by its variety): the other
 * side's owners and members were told, as the contract service tells them.
 */
export const NOTICED_MOVES: { variety: string, action: 'offered' | 'countered' | 'accepted', read: boolean }[] = [
  { variety: 'Kingston Black', action: 'accepted', read: true },
  { variety: 'Yarlington Mill', action: 'offered', read: true },
  { variety: 'Yarlington Mill', action: 'countered', read: false },
]
