import { idParamSchema } from '../../../../shared/schemas/account'
import { organisationStatusSchema } from '../../../../shared/schemas/admin'
import { setOrganisationStatus } from '../../../repositories/organisations'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, { roles: ['admin'] })
  const { id } = parseParams(event, idParamSchema)
  const { status } = await parseBody(event, organisationStatusSchema)
  return setOrganisationStatus(admin.id, id, status)
})
