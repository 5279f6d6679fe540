import { rootstockCreateSchema } from '#shared/schemas/catalogue'
import { createRootstock } from '../../services/catalogue'

// Only the platform admin curates the catalogue.
export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, ACCESS_RULES.curateCatalogue)
  const input = await parseBody(event, rootstockCreateSchema)
  const created = await createRootstock(admin.id, input)
  setResponseStatus(event, 201)
  return created
})
