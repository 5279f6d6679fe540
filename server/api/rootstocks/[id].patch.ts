import { idParamSchema } from '#shared/schemas/fields'
import { rootstockPatchSchema } from '#shared/schemas/catalogue'
import { updateRootstock } from '../../services/catalogue'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.curateCatalogue)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, rootstockPatchSchema)
  return updateRootstock(admin.id, id, patch)
})
