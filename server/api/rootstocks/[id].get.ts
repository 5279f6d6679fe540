import { idParamSchema } from '#shared/schemas/fields'
import { getRootstock } from '../../repositories/rootstocks'

export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.signedIn)
  const { id } = parseParams(event, idParamSchema)
  return getRootstock(id)
})
