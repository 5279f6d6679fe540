import { idParamSchema } from '#shared/schemas/fields'
import { getTreeContractProgress } from '../../../services/treeContractProgress'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readContracts)
  const { id } = parseParams(event, idParamSchema)
  return getTreeContractProgress(user, id)
})
