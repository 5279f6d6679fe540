import { idParamSchema } from '#shared/schemas/fields'
import { budwoodClearSchema } from '#shared/schemas/nursery'
import { clearBudwoodSuspectFor } from '../../../../services/budwood'

// Clears a suspect lot (409 when it is not suspect); the suspicion stays on record.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, budwoodClearSchema)
  return clearBudwoodSuspectFor(user, id, input)
})
