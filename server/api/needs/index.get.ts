import { getNeeds } from '../../services/needs'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNeeds)
  return getNeeds(user.orgId)
})
