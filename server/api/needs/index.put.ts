import { needsPutSchema } from '#shared/schemas/contract'
import { replaceNeeds } from '../../services/needs'

// Replaces the maker's whole needs table; answers the table as saved.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNeeds)
  const { items } = await parseBody(event, needsPutSchema)
  return replaceNeeds(user.orgId, user.id, items)
})
