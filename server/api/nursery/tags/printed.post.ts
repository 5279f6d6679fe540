import { tagsPrintedSchema } from '#shared/schemas/nursery'
import { markPrinted } from '../../../services/nurseryRuns'

// `{ runIds }` → the runs' tags are marked printed now. Answers `{ items, total }`: the runs as
// GET answers them, with their new `tagPrintedAt` (and no stale-tag warning). One id that is not
// the organisation's run refuses the lot with 404, and nothing is marked.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { runIds } = await parseBody(event, tagsPrintedSchema)
  return markPrinted(user, runIds)
})
