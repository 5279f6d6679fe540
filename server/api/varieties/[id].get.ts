import { idParamSchema } from '#shared/schemas/fields'
import { getVariety } from '../../repositories/varieties'

export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.signedIn)
  const { id } = parseParams(event, idParamSchema)
  return getVariety(id)
})
