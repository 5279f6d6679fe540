import { fruitContractListQuerySchema } from '#shared/schemas/contract'
import { listFruitContractsFor } from '../../services/fruitContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readContracts)
  return listFruitContractsFor(user, parseQuery(event, fruitContractListQuerySchema))
})
