import { idParamSchema } from '#shared/schemas/fields'
import { bedRecordCreateSchema } from '#shared/schemas/nursery'
import { createBedRecord } from '../../../../services/nurseryBeds'

// A yearly record on a bed; liners lifted become a liner lot in the same write.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, bedRecordCreateSchema)
  const record = await createBedRecord(user.orgId, user.id, id, input)
  setResponseStatus(event, 201)
  return record
})
