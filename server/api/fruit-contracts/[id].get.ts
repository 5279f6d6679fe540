import { idParamSchema } from '#shared/schemas/fields'
import { getFruitContract } from '../../services/fruitContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readContracts)
  const { id } = parseParams(event, idParamSchema)
  return getFruitContract(user, id)
})
