import { dispatchLabelsQuerySchema } from '#shared/schemas/dispatch'
import { idParamSchema } from '#shared/schemas/fields'
import { dispatchLabels } from '../../../services/dispatch'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  const query = parseQuery(event, dispatchLabelsQuerySchema)
  return dispatchLabels(user, id, query)
})
