import { idParamSchema } from '#shared/schemas/fields'
import { changeMember } from '../../services/members'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.manageMembers)
  const { id } = parseParams(event, idParamSchema)
  await changeMember(owner.orgId, owner.id, id, { remove: true })
  setResponseStatus(event, 204)
  return null
})
