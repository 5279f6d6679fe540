import { idParamSchema } from '#shared/schemas/fields'
import { moveOrganisation } from '../../../../services/organisations'

// One route per move; the move table in shared/utils/organisationStatus.ts says from which state.
export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.platformAdmin)
  const { id } = parseParams(event, idParamSchema)
  return moveOrganisation({ role: 'admin', userId: admin.id }, id, 'reopen')
})
