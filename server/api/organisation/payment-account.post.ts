import { getSettings } from '../../services/organisations'
import { connectPaymentAccount } from '../../services/payments'

// An owner of a grower or nursery connects the account it is paid into; the settings come back with it.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.connectPaymentAccount)
  await connectPaymentAccount(user)
  return getSettings(user.orgId)
})
