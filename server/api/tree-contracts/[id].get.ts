import { idParamSchema } from '#shared/schemas/fields'
import { getTreeContract } from '../../services/treeContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readContracts)
  const { id } = parseParams(event, idParamSchema)
  return getTreeContract(user, id)
})
