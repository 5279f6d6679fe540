import { sugarQuerySchema } from '#shared/schemas/calc'
import { calculateFor, sugarReading } from '../../utils/calculators'

// Public: °Brix or apparent SG → SG (apparent and true), °Plato, sugar g/L and potential alcohol.
export default defineEventHandler((event) => {
  const query = parseQuery(event, sugarQuerySchema)
  return calculateFor(query.brix !== undefined ? ['brix'] : ['sg'], () => sugarReading(query))
})
