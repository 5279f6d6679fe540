import { linerLotCreateSchema } from '#shared/schemas/nursery'
import { buyLinerLot } from '../../../services/liners'

// A lot of liners bought in.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const input = await parseBody(event, linerLotCreateSchema)
  const lot = await buyLinerLot(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return lot
})
