import { organisationPatchSchema } from '#shared/schemas/organisation'
import { updateSettings } from '../../services/organisations'

// Owners change their organisation's settings; which fields apply follows its kind.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.editSettings)
  const patch = await parseBody(event, organisationPatchSchema({ kind: user.orgKind!, isNursery: user.isNursery }))
  return updateSettings(user.orgId, user.id, patch)
})
