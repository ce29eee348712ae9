import { conflictListQuerySchema } from '#shared/schemas/sync'
import { listConflicts } from '../../utils/sync/conflicts'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, validateWith(conflictListQuerySchema))
  return listConflicts(user, query)
})
