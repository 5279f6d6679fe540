import { classQuerySchema } from '#shared/schemas/calc'
import type { ClassResult } from '#shared/types/calc'
import { juiceClass } from '#shared/utils/juiceClass'
import { calculateFor } from '../../utils/calculators'

// Public: the juice class of one reading (TA as malic and tannin, g/L), by the Long Ashton
// thresholds for apple juice or Pollard & Beech's for perry pear juice.
export default defineEventHandler((event): ClassResult => {
  const { taGPerL, tanninGPerL, species } = parseQuery(event, classQuerySchema)
  return { juiceClass: calculateFor(['taGPerL', 'tanninGPerL'], () => juiceClass(taGPerL, tanninGPerL, species)), species }
})
