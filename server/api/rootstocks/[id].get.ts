import { idParamSchema } from '#shared/schemas/fields'
import { getRootstock } from '../../repositories/rootstocks'

export default defineEventHandler(async (event) => {
  await requireUser(event, { roles: [...READERS, 'admin'] })
  const { id } = parseParams(event, idParamSchema)
  return getRootstock(id)
})
