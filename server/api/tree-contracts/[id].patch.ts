import { treeTermsPatchSchema, type TreeTermsPatch } from '#shared/schemas/contract'
import { idParamSchema } from '#shared/schemas/fields'
import { editTreeDraft, getTreeContract } from '../../services/treeContracts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeContracts)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, treeTermsPatchSchema) as TreeTermsPatch
  await editTreeDraft(user, id, patch)
  return getTreeContract(user, id)
})
