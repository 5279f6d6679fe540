import { fruitTermsPatchSchema, type FruitTermsPatch } from '#shared/schemas/contract'
import { idParamSchema } from '#shared/schemas/fields'
import { editFruitDraft, getFruitContract } from '../../services/fruitContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeContracts)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, fruitTermsPatchSchema) as FruitTermsPatch
  await editFruitDraft(user, id, patch)
  return getFruitContract(user, id)
})
