import { treeContractListQuerySchema } from '#shared/schemas/contract'
import { listTreeContractsFor } from '../../services/treeContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readContracts)
  return listTreeContractsFor(user, parseQuery(event, treeContractListQuerySchema))
})
