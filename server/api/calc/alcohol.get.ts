import { alcoholQuerySchema } from '#shared/schemas/calc'
import type { AlcoholResult } from '#shared/types/calc'
import { abvFromGravity } from '#shared/utils/alcohol'
import { calculateFor } from '../../utils/calculators'

// Public: % ABV from original and final gravity by the chosen method (gravity drop unless named).
export default defineEventHandler((event): AlcoholResult => {
  const { og, fg, method } = parseQuery(event, alcoholQuerySchema)
  return { abv: calculateFor(['og', 'fg'], () => abvFromGravity(og, fg, method)), method }
})
