import { idParamSchema, pageQuerySchema } from '#shared/schemas/fields'
import { listRecordsOfBed } from '../../../../services/nurseryBeds'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  const page = parseQuery(event, pageQuerySchema)
  return listRecordsOfBed(user.orgId, id, page)
})
