import { treeContractCreateSchema } from '#shared/schemas/contract'
import { createTreeContract, getTreeContract } from '../../services/treeContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeContracts)
  const input = await parseBody(event, treeContractCreateSchema)
  const id = await createTreeContract(user, input)
  setResponseStatus(event, 201)
  return getTreeContract(user, id)
})
