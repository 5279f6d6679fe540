import { backPlanQuerySchema } from '#shared/schemas/calc'
import type { BackPlanResult } from '#shared/types/calc'
import { nurseryBackPlan } from '#shared/utils/backplan'
import { calculateFor } from '../../utils/calculators'

// Public: when each propagation step must be done to deliver trees in a season, and how many
// rootstocks to bud for the count wanted at the nursery's take and survival rates.
export default defineEventHandler((event): BackPlanResult => {
  const q = parseQuery(event, backPlanQuerySchema)
  const plan = calculateFor(['takePct', 'survivalPct'], () => nurseryBackPlan({ deliveryYear: q.deliveryYear, season: q.season, trees: q.trees, takeRate: q.takePct / 100, survivalRate: q.survivalPct / 100 }))
  return { deliveryYear: q.deliveryYear, season: q.season, trees: q.trees, ...plan }
})
