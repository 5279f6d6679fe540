import { pageQuerySchema } from '#shared/schemas/fields'
import { listOrganisations } from '../../../repositories/organisations'

export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.platformAdmin)
  return listOrganisations(parseQuery(event, pageQuerySchema))
})
