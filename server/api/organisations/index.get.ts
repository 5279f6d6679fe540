import { directoryQuerySchema } from '#shared/schemas/organisation'
import { listDirectory } from '../../services/directory'

// The directory of listed organisations: every signed-in person reads it, the platform admin too.
export default defineEventHandler(async (event) => {
  await requireUser(event, ACCESS_RULES.directory)
  return listDirectory(parseQuery(event, directoryQuerySchema))
})
