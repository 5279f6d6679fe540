import { memberPatchSchema } from '#shared/schemas/account'
import { idParamSchema } from '#shared/schemas/fields'
import { changeMember } from '../../services/members'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.manageMembers)
  const { id } = parseParams(event, idParamSchema)
  const { role } = await parseBody(event, memberPatchSchema)
  return changeMember(owner.orgId, owner.id, id, { role })
})
