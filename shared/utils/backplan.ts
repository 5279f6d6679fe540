// Nursery back-plan: from the season a buyer wants finished trees, the date by
// which each propagation step must be done, and how many rootstocks to bud.
//
// The cycle of a one-year (maiden) tree (R. Crassweller, Penn State, "Nursery Production of
// Finished Apple Trees", eXtension apples): rootstock liners planted in spring; budded in late
// summer of the same year; headed back (rootstock cut off above the bud) the next spring while
// still dormant; finished trees dug in late autumn of that year, then delivered straight away
// (autumn delivery) or sold for planting the following spring.
//
// Other tree types (Good Fruit Grower, "Types of trees"; the nursery trade):
// - a sleeping eye is the same rootstock budded in late summer and dug, the bud still dormant,
//   before growth starts the next spring; the buyer heads it back after planting;
// - a feathered maiden is a maiden with side shoots, grown in the same time (common practice);
// - a knip tree grows one season more: the one-year tree is cut back in winter to a short
//   leader ("knip") and grown again;
// - a double-worked tree (a pear on an interstem over quince, or an apple on an interstem) takes
//   one season more: the interstem is budded onto the rootstock, grown a season, and the variety
//   budded onto it the summer after (double chip-budding in successive years);
// - a bench graft is grafted indoors in late winter onto a lifted rootstock, lined out in spring
//   and dug after that one season, with no budding step (common practice; Good Fruit Grower
//   describes the graft being made January to April).
// A knip tree on an interstem takes both extra seasons (common practice).
// The calendar days below are common practice for the northern hemisphere, not from the sources,
// which name seasons only. In the southern hemisphere every date falls six months off, so that the
// delivery still falls in the delivery year in that hemisphere's season: an autumn delivery six
// months earlier (30 November → 30 May), a spring one six months later (15 April → 15 October).

import { HEMISPHERES, seasonalMonthDay, type Hemisphere } from './hemisphere'

/** Every step a plan can have, in the order they fall; a plan lists only its tree type's. */
export const PROPAGATION_STEPS = [
  'benchGrafted',
  'linersPlanted',
  'interstemBudded',
  'interstemHeadedBack',
  'budded',
  'headedBack',
  'knipCutBack',
  'dug',
  'delivered',
] as const
export type PropagationStep = (typeof PROPAGATION_STEPS)[number]

export const DELIVERY_SEASONS = ['autumn', 'spring'] as const
export type DeliverySeason = (typeof DELIVERY_SEASONS)[number]

/**
 * What the buyer receives. A sleeping eye is a rootstock with a dormant bud, dug the spring after
 * budding; a one-year (maiden) tree, feathered or not, after one season's growth; a knip tree a
 * season more; a bench graft is grafted indoors in winter and grown one season.
 */
export const TREE_TYPES = ['sleeping-eye', 'maiden', 'feathered', 'knip', 'bench-graft'] as const
export type TreeType = (typeof TREE_TYPES)[number]

export interface BackPlanStep {
  step: PropagationStep
  /** Latest date for the step, YYYY-MM-DD. */
  by: string
}

export interface BackPlanOptions {
  /** Default 'maiden'. */
  treeType?: TreeType
  /** Double-worked on an interstem; default false. */
  interstem?: boolean
  /** Where the nursery grows; default 'north'. */
  hemisphere?: Hemisphere
}

type Deadline = PropagationStep | 'deliveredSpring' | 'dugSpring'

// Month and day each step must be done by (common practice).
const DEADLINE: Record<Deadline, { month: number, day: number }> = {
  // Late winter, so the grafts can callus for a fortnight in the warm and wait in the cool until
  // hard frost is past (Raintree Nursery, "Tips for bench grafting": 10–14 days at 60–70 °F).
  benchGrafted: { month: 3, day: 15 },
  linersPlanted: { month: 4, day: 30 }, // spring planting, before growth starts in earnest
  interstemBudded: { month: 9, day: 30 }, // the same budding season as the variety's
  interstemHeadedBack: { month: 3, day: 31 }, // cut above the interstem bud while dormant
  // Budding is done in August or September in the north (common practice): late August to early
  // September above 36° N while the bark slips (Crassweller, eXtension, 'When should apple trees be
  // budded?'); T-budding June to September (Ohio State, eXtension, 'Apple Tree Propagation: Budding').
  budded: { month: 9, day: 30 },
  headedBack: { month: 3, day: 31 }, // cut above the bud while dormant
  knipCutBack: { month: 3, day: 31 }, // the one-year tree cut back while dormant
  dug: { month: 11, day: 15 }, // after leaf fall
  dugSpring: { month: 3, day: 15 }, // a sleeping eye for spring delivery, dug before the bud breaks
  delivered: { month: 11, day: 30 }, // autumn delivery, right after digging
  deliveredSpring: { month: 4, day: 15 }, // early spring, for planting
}

function isoDate(year: number, month: number, day: number): string {
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`
}

/**
 * A northern date of a plan (YYYY-MM-DD) as it falls in `hemisphere`. In the south it moves six
 * months back for an autumn delivery and six months on for a spring one, so the delivery stays in
 * its year; a day past the new month's end falls on its last day (31 March → 30 September).
 */
export function seasonalDate(northDate: string, season: DeliverySeason, hemisphere: Hemisphere = 'north'): string {
  if (hemisphere === 'north') return northDate
  const [year, month, day] = northDate.split('-').map(Number) as [number, number, number]
  const moved = seasonalMonthDay({ month, day }, hemisphere)
  const movedYear = season === 'autumn' ? (month <= 6 ? year - 1 : year) : (month > 6 ? year + 1 : year)
  return isoDate(movedYear, moved.month, moved.day)
}

/**
 * Why a tree type cannot be double-worked, or null when it can. The interstem is budded onto the
 * rootstock a season before the variety is budded onto the interstem, so it needs a tree budded in
 * the nursery row and grown on: a maiden, feathered maiden or knip tree. A sleeping eye is dug
 * before its bud grows, and a bench graft is one graft made indoors.
 */
export function interstemProblem(treeType: TreeType, interstem: boolean): string | null {
  if (!interstem) return null
  if (treeType === 'sleeping-eye') {
    return 'A sleeping eye cannot be on an interstem: it is dug with its bud still dormant, before a variety could be budded onto an interstem shoot. Choose a maiden, feathered maiden or knip tree'
  }
  if (treeType === 'bench-graft') {
    return 'A bench graft cannot be on an interstem: it is one graft made indoors, while the interstem is budded in the nursery row a season before the variety. Choose a maiden, feathered maiden or knip tree'
  }
  return null
}

function checkTreeType(treeType: TreeType, interstem: boolean): void {
  if (!TREE_TYPES.includes(treeType)) {
    throw new RangeError(`Tree type must be one of ${TREE_TYPES.join(', ')}; got ${String(treeType)}`)
  }
  if (typeof interstem !== 'boolean') {
    throw new RangeError(`Interstem must be true or false; got ${String(interstem)}`)
  }
  const problem = interstemProblem(treeType, interstem)
  if (problem) throw new RangeError(problem)
}

/**
 * Growing seasons more than a maiden takes (fewer when negative): a knip tree and a double-worked
 * tree one each, both together two; a sleeping eye and a bench graft one fewer.
 */
export function extraSeasons(treeType: TreeType = 'maiden', interstem = false): number {
  checkTreeType(treeType, interstem)
  const own = treeType === 'knip' ? 1 : treeType === 'sleeping-eye' || treeType === 'bench-graft' ? -1 : 0
  return own + (interstem ? 1 : 0)
}

/**
 * Growing seasons in the nursery row, from lining out to digging: 2 for a maiden (the season it is
 * budded and the season it grows), 1 for a sleeping eye or bench graft, 3 for a knip tree or a
 * double-worked maiden, 4 for a knip tree on an interstem.
 */
export function propagationSeasons(treeType: TreeType = 'maiden', interstem = false): number {
  return 2 + extraSeasons(treeType, interstem)
}

/** The dated steps, in order, for trees delivered in `season` of `deliveryYear`. */
export function backPlanSteps(deliveryYear: number, season: DeliverySeason, options: BackPlanOptions = {}): BackPlanStep[] {
  if (!Number.isInteger(deliveryYear) || deliveryYear < 1900 || deliveryYear > 9999) {
    throw new RangeError(`Delivery year must be a whole year from 1900 to 9999; got ${deliveryYear}`)
  }
  if (!DELIVERY_SEASONS.includes(season)) {
    throw new RangeError(`Delivery season must be 'autumn' or 'spring'; got ${String(season)}`)
  }
  const { treeType = 'maiden', interstem = false, hemisphere = 'north' } = options
  if (!HEMISPHERES.includes(hemisphere)) {
    throw new RangeError(`Hemisphere must be 'north' or 'south'; got ${String(hemisphere)}`)
  }
  const seasons = propagationSeasons(treeType, interstem)
  // The last growing season: the delivery year for autumn, the year before for spring.
  const lastSeason = season === 'autumn' ? deliveryYear : deliveryYear - 1
  const at = (deadline: Deadline, year: number): BackPlanStep => ({
    step: deadline === 'deliveredSpring' ? 'delivered' : deadline === 'dugSpring' ? 'dug' : deadline,
    by: seasonalDate(isoDate(year, DEADLINE[deadline].month, DEADLINE[deadline].day), season, hemisphere),
  })

  let year = lastSeason - seasons + 1 // the season the liners are lined out
  const steps: BackPlanStep[] = []
  if (treeType === 'bench-graft') {
    steps.push(at('benchGrafted', year), at('linersPlanted', year))
  }
  else {
    steps.push(at('linersPlanted', year))
    if (interstem) {
      steps.push(at('interstemBudded', year), at('interstemHeadedBack', year + 1))
      year += 1
    }
    steps.push(at('budded', year))
    if (treeType !== 'sleeping-eye') steps.push(at('headedBack', year + 1))
    if (treeType === 'knip') steps.push(at('knipCutBack', year + 2))
  }
  // A sleeping eye for spring is dug in the spring of delivery, before its bud breaks.
  steps.push(treeType === 'sleeping-eye' && season === 'spring' ? at('dugSpring', deliveryYear) : at('dug', lastSeason))
  steps.push(season === 'autumn' ? at('delivered', deliveryYear) : at('deliveredSpring', deliveryYear))
  return steps
}

// What a step's lateness means, for a warning in plain words.
const SHOULD_HAVE_BEEN: Record<PropagationStep, string> = {
  benchGrafted: 'the bench grafts should have been made',
  linersPlanted: 'rootstock liners should have been lined out',
  interstemBudded: 'the interstem should have been budded onto the rootstocks',
  interstemHeadedBack: 'the rootstocks should have been headed back above the interstem bud',
  budded: 'the rootstocks should have been budded with the variety',
  headedBack: 'the budded rootstocks should have been headed back above the bud',
  knipCutBack: 'the one-year trees should have been cut back to knips',
  dug: 'the trees should have been dug',
  delivered: 'the trees should have been delivered',
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

function parseIsoDate(iso: string, what: string): { year: number, month: number, day: number } {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso)
  const [year, month, day] = match ? [Number(match[1]), Number(match[2]), Number(match[3])] : [Number.NaN, Number.NaN, Number.NaN]
  const date = new Date(Date.UTC(year, month - 1, day))
  if (!match || date.getUTCFullYear() !== year || date.getUTCMonth() !== month - 1 || date.getUTCDate() !== day) {
    throw new RangeError(`${what} must be a date as YYYY-MM-DD; got ${String(iso)}`)
  }
  return { year, month, day }
}

/**
 * For a plan not yet started: a sentence saying the delivery season is too close when the first
 * step's date is already past on `today` (YYYY-MM-DD), or null when there is still time. A step due
 * today is not yet late.
 */
export function backPlanWarning(steps: readonly BackPlanStep[], today: string): string | null {
  parseIsoDate(today, 'Today')
  const first = steps[0]
  if (!first) return null
  const { year, month, day } = parseIsoDate(first.by, 'A step\'s date')
  // ISO dates of the same shape order as text.
  if (first.by >= today) return null
  return `The delivery season is too close: ${SHOULD_HAVE_BEEN[first.step]} by ${day} ${MONTHS[month - 1]} ${year}.`
}

function requireRate(rate: number, what: string): void {
  if (!Number.isFinite(rate) || rate <= 0 || rate > 1) {
    throw new RangeError(`${what} must be above 0 and at most 1; got ${rate}`)
  }
}

/**
 * Rootstocks to bud to end with `trees` saleable trees:
 * ceil(trees / (take rate × survival rate)), where the take rate is the share
 * of buds that take and the survival rate the share of taken trees that reach
 * sale (after losses and grading).
 */
export function rootstocksToBud(trees: number, takeRate: number, survivalRate: number): number {
  if (!Number.isInteger(trees) || trees < 1) {
    throw new RangeError(`Trees wanted must be a whole number of at least 1; got ${trees}`)
  }
  requireRate(takeRate, 'Take rate')
  requireRate(survivalRate, 'Survival rate')
  // The small allowance stops binary rounding (e.g. 900 / 0.9 = 1000.0000000000001) adding a tree.
  return Math.ceil(trees / (takeRate * survivalRate) - 1e-9)
}

export interface NurseryBackPlanInput extends BackPlanOptions {
  deliveryYear: number
  season: DeliverySeason
  trees: number
  takeRate: number
  survivalRate: number
}

export interface NurseryBackPlan {
  steps: BackPlanStep[]
  rootstocksToBud: number
}

/** The whole back-plan for a tree contract: dated steps and rootstocks to bud. */
export function nurseryBackPlan(input: NurseryBackPlanInput): NurseryBackPlan {
  return {
    steps: backPlanSteps(input.deliveryYear, input.season, { treeType: input.treeType, interstem: input.interstem, hemisphere: input.hemisphere }),
    rootstocksToBud: rootstocksToBud(input.trees, input.takeRate, input.survivalRate),
  }
}
