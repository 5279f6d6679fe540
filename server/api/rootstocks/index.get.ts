import { rootstockListQuerySchema } from '#shared/schemas/catalogue'
import { listRootstocks } from '../../repositories/rootstocks'

// The shared catalogue: every signed-in person reads it, the platform admin too.
export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.signedIn)
  return listRootstocks(parseQuery(event, rootstockListQuerySchema))
})
