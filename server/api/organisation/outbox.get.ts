import { outboxQuerySchema } from '#shared/schemas/notice'
import { listOrganisationOutbox } from '../../repositories/outbox'

// The e-mail sent in the organisation's name, for its owners: to whom, when, and what failed and why.
export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.organisationOutbox)
  const query = parseQuery(event, outboxQuerySchema)
  return listOrganisationOutbox(owner.orgId, query)
})
