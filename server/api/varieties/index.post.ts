import { varietyCreateSchema } from '#shared/schemas/catalogue'
import { createVariety } from '../../services/catalogue'

// Only the platform admin curates the catalogue.
export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.curateCatalogue)
  const input = await parseBody(event, varietyCreateSchema)
  const created = await createVariety(admin.id, input)
  setResponseStatus(event, 201)
  return created
})
