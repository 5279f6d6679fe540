import { idParamSchema } from '#shared/schemas/fields'
import { getDirectoryEntry } from '../../services/directory'

// One organisation's directory entry: a listed one, or the caller's own even when unlisted.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event, ACCESS_RULES.directory)
  const { id } = parseParams(event, idParamSchema)
  return getDirectoryEntry(id, user.orgId)
})
