import { idParamSchema } from '../../../shared/schemas/account'
import { varietyPatchSchema } from '../../../shared/schemas/catalogue'
import { updateVariety } from '../../repositories/varieties'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, { roles: ['admin'] })
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, varietyPatchSchema)
  return updateVariety(admin.id, id, patch)
})
