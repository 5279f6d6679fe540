import { pageQuerySchema } from '#shared/schemas/fields'
import { listOrganisations } from '../../../repositories/organisations'

export default defineEventHandler(async (event) => {
  await requireUser(event, { roles: ['admin'] })
  return listOrganisations(parseQuery(event, pageQuerySchema))
})
