import { idParamSchema } from '#shared/schemas/fields'
import { organisationStatusSchema } from '#shared/schemas/admin'
import { setOrganisationStatusByAdmin } from '../../../services/organisations'

// `{ status }` for the admin's tools that set a state rather than name a move; the same table decides.
export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.platformAdmin)
  const { id } = parseParams(event, idParamSchema)
  const { status } = await parseBody(event, organisationStatusSchema)
  return setOrganisationStatusByAdmin(admin.id, id, status)
})
