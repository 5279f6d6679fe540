import { acidQuerySchema } from '#shared/schemas/calc'
import { acidity, calculateFor } from '../../utils/calculators'

// Public: titratable acidity (a figure, or a titration with NaOH) as malic, tartaric and sulfuric g/L.
export default defineEventHandler((event) => {
  const query = parseQuery(event, acidQuerySchema)
  const fields = query.value !== undefined ? ['value'] : ['naohMl', 'normality', 'sampleMl']
  return calculateFor(fields, () => acidity(query))
})
