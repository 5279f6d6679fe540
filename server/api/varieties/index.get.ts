import { varietyListQuerySchema } from '#shared/schemas/catalogue'
import { listVarieties } from '../../repositories/varieties'

// The shared catalogue: every signed-in person reads it, the platform admin too.
export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.signedIn)
  return listVarieties(parseQuery(event, varietyListQuerySchema))
})
