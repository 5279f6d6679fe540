import { idParamSchema } from '#shared/schemas/fields'
import { statementFormatQuerySchema } from '#shared/schemas/statement'
import { deliveryStatement, statementCsvFile } from '../../../services/statements'

// One delivery's self-billing statement, for either party of its contract; `?format=csv` downloads it.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readDeliveries)
  const { id } = parseParams(event, idParamSchema)
  const { format } = parseQuery(event, statementFormatQuerySchema)
  const statement = await deliveryStatement(user.orgId, id)
  if (format === 'json') return statement
  const file = statementCsvFile(statement)
  setResponseHeaders(event, file.headers)
  return file.body
})
