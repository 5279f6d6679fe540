import { backPlanQuerySchema } from '#shared/schemas/calc'
import type { BackPlanResult } from '#shared/types/calc'
import { nurseryBackPlan } from '#shared/utils/backplan'
import { calculateFor } from '../../utils/calculators'

// Public: when each propagation step must be done to deliver trees of a type (on an interstem or
// not) in a season, and how many rootstocks to bud for the count wanted at the nursery's take and
// survival rates, in the northern hemisphere's season or (asked) the southern one. The schema
// refuses an interstem the tree type cannot have.
export default defineEventHandler((event): BackPlanResult => {
  const q = parseQuery(event, backPlanQuerySchema)
  const plan = calculateFor(['takePct', 'survivalPct'], () => nurseryBackPlan({
    deliveryYear: q.deliveryYear, season: q.season, trees: q.trees, takeRate: q.takePct / 100, survivalRate: q.survivalPct / 100, treeType: q.treeType, interstem: q.interstem, hemisphere: q.hemisphere,
  }))
  return { deliveryYear: q.deliveryYear, season: q.season, trees: q.trees, treeType: q.treeType, interstem: q.interstem, hemisphere: q.hemisphere, ...plan }
})
