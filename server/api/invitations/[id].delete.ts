import { idParamSchema } from '#shared/schemas/fields'
import { revokeInvitation } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.manageMembers)
  const { id } = parseParams(event, idParamSchema)
  await revokeInvitation(owner, id)
  setResponseStatus(event, 204)
  return null
})
