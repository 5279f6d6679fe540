import { idParamSchema } from '#shared/schemas/fields'
import { deleteVariety } from '../../services/catalogue'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.curateCatalogue)
  const { id } = parseParams(event, idParamSchema)
  await deleteVariety(admin.id, id)
  setResponseStatus(event, 204)
  return null
})
