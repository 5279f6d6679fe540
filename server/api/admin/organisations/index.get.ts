import { pageQuerySchema } from '../../../../shared/schemas/account'
import { listOrganisations } from '../../../repositories/organisations'

export default defineEventHandler(async (event) => {
  await requireUser(event, { roles: ['admin'] })
  return listOrganisations(parseQuery(event, pageQuerySchema))
})
