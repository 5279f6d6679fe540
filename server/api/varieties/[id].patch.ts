import { idParamSchema } from '#shared/schemas/fields'
import { varietyPatchSchema } from '#shared/schemas/catalogue'
import { updateVariety } from '../../services/catalogue'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.curateCatalogue)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, varietyPatchSchema)
  return updateVariety(admin.id, id, patch)
})
