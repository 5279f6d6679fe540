import { idParamSchema } from '#shared/schemas/fields'
import { getVariety } from '../../repositories/varieties'

export default defineEventHandler(async (event) => {
  await requireUser(event, { roles: [...READERS, 'admin'] })
  const { id } = parseParams(event, idParamSchema)
  return getVariety(id)
})
