import { plantingQuerySchema } from '#shared/schemas/calc'
import type { PlantingResult } from '#shared/types/calc'
import { plantingDensity } from '#shared/utils/planting'
import { calculateFor, plantingSpacing } from '../../utils/calculators'

// Public: trees per hectare and per acre from in-row and between-row spacing in metres or feet.
export default defineEventHandler((event): PlantingResult => {
  const { inRow, betweenRow, unit, fields } = plantingSpacing(parseQuery(event, plantingQuerySchema))
  const { perHa, perAcre } = calculateFor(fields, () => plantingDensity(inRow, betweenRow, unit))
  return { treesPerHectare: perHa, treesPerAcre: perAcre }
})
