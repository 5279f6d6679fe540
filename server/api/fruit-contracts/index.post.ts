import { fruitContractCreateSchema } from '#shared/schemas/contract'
import { createFruitContract, getFruitContract } from '../../services/fruitContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeContracts)
  const input = await parseBody(event, fruitContractCreateSchema)
  const id = await createFruitContract(user, input)
  setResponseStatus(event, 201)
  return getFruitContract(user, id)
})
