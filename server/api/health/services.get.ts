import { ACCESS_RULES, decideAccess } from '#shared/utils/access'
import { SERVICE_CHECKS } from '../../utils/serviceChecks'
import { checkAll, databaseUp, serviceReport } from '../../utils/serviceHealth'

// Each service's state and response time, for monitors and the operator. Open to everyone, like
// /api/health: states and times say no more than a failing page would. Error texts name internal
// hosts, ports and buckets, so only the platform admin gets them; the caller is checked against the
// database, as on every request, so while the database is down nobody gets them.
export default defineEventHandler(async (event) => {
  const services = await checkAll(SERVICE_CHECKS)
  const caller = databaseUp(services) ? await currentUser(event) : null
  const report = serviceReport(services, { withErrors: decideAccess(caller, ACCESS_RULES.platformAdmin).ok })
  setResponseHeader(event, 'cache-control', 'no-store')
  setResponseStatus(event, report.statusCode)
  return report.body
})
