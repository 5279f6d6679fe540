import { idParamSchema } from '#shared/schemas/fields'
import { budwoodExposure } from '../../../../services/budwood'

// Every run the lot may have carried disease to, suspect or not: `{ lot, items, totals }`.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  return budwoodExposure(user.orgId, id)
})
