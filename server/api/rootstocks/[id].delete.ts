import { idParamSchema } from '../../../shared/schemas/account'
import { deleteRootstock } from '../../repositories/rootstocks'

export default defineEventHandler(async (event) => {
  const admin = await requireUser(event, { roles: ['admin'] })
  const { id } = parseParams(event, idParamSchema)
  await deleteRootstock(admin.id, id)
  setResponseStatus(event, 204)
  return null
})
