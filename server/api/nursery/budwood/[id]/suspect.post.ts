import { idParamSchema } from '#shared/schemas/fields'
import { budwoodSuspectSchema } from '#shared/schemas/nursery'
import { markBudwoodSuspectFor } from '../../../../services/budwood'

// Marks the lot suspect of disease; each buyer with trees on its exposure list is told. 409 while it is suspect already.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, budwoodSuspectSchema)
  return markBudwoodSuspectFor(user, id, input)
})
