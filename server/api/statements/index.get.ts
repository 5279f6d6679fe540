import { statementQuerySchema } from '#shared/schemas/statement'
import { listStatementSeasons, seasonStatement, statementCsvFile } from '../../services/statements'

// With `contractId` and `season`, that contract's season statement (`?format=csv` downloads it);
// without a contract, the seasons the caller's organisation has statements for, newest first.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readDeliveries)
  const query = parseQuery(event, statementQuerySchema)
  if (query.contractId === undefined) return listStatementSeasons(user.orgId, query)
  const statement = await seasonStatement(user.orgId, query.contractId, query.season!)
  if (query.format === 'json') return statement
  const file = statementCsvFile(statement)
  setResponseHeaders(event, file.headers)
  return file.body
})
