import { listDue } from '../../services/payments'

// What the organisation owes and is owed that has no payment under way yet.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readPayments)
  return listDue(user)
})
