// Nursery back-plan: from the season a buyer wants finished trees, the date by
// which each propagation step must be done, and how many rootstocks to bud.
//
// The cycle (R. Crassweller, Penn State, "Nursery Production of Finished Apple
// Trees", eXtension apples): rootstock liners planted in spring; budded in late
// summer of the same year; headed back (rootstock cut off above the bud) the
// next spring while still dormant; finished trees dug in late autumn of that
// year, then delivered straight away (autumn delivery) or sold for planting the
// following spring.
// The calendar days below are common practice for the northern hemisphere, not
// from the source, which names seasons only.

export const PROPAGATION_STEPS = ['linersPlanted', 'budded', 'headedBack', 'dug', 'delivered'] as const
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

// Month and day each step must be done by (common practice).
const DEADLINE: Record<PropagationStep | 'deliveredSpring', { month: number, day: number }> = {
  linersPlanted: { month: 4, day: 30 }, // spring planting, before growth starts in earnest
  // Budding is done in August or September in the north (common practice): late August to early
  // September above 36° N while the bark slips (Crassweller, eXtension, 'When should apple trees be
  // budded?'); T-budding June to September (Ohio State, eXtension, 'Apple Tree Propagation: Budding').
  budded: { month: 9, day: 30 },
  headedBack: { month: 3, day: 31 }, // cut above the bud while dormant
  dug: { month: 11, day: 15 }, // after leaf fall
  delivered: { month: 11, day: 30 }, // autumn delivery, right after digging
  deliveredSpring: { month: 4, day: 15 }, // early spring, for planting
}

function isoDate(year: number, month: number, day: number): string {
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`
}

/** The dated steps, in order, for trees delivered in `season` of `deliveryYear`. */
export function backPlanSteps(deliveryYear: number, season: DeliverySeason): BackPlanStep[] {
  if (!Number.isInteger(deliveryYear) || deliveryYear < 1900 || deliveryYear > 9999) {
    throw new RangeError(`Delivery year must be a whole year from 1900 to 9999; got ${deliveryYear}`)
  }
  if (!DELIVERY_SEASONS.includes(season)) {
    throw new RangeError(`Delivery season must be 'autumn' or 'spring'; got ${String(season)}`)
  }
  // The year the trees are dug: the delivery year for autumn, the year before for spring.
  const digYear = season === 'autumn' ? deliveryYear : deliveryYear - 1
  const at = (step: PropagationStep | 'deliveredSpring', year: number): string =>
    isoDate(year, DEADLINE[step].month, DEADLINE[step].day)
  return [
    { step: 'linersPlanted', by: at('linersPlanted', digYear - 1) },
    { step: 'budded', by: at('budded', digYear - 1) },
    { step: 'headedBack', by: at('headedBack', digYear) },
    { step: 'dug', by: at('dug', digYear) },
    { step: 'delivered', by: season === 'autumn' ? at('delivered', deliveryYear) : at('deliveredSpring', deliveryYear) },
  ]
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

export interface NurseryBackPlanInput {
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
    steps: backPlanSteps(input.deliveryYear, input.season),
    rootstocksToBud: rootstocksToBud(input.trees, input.takeRate, input.survivalRate),
  }
}
