import { pullQuerySchema } from '#shared/schemas/sync'
import { syncPull } from '../../utils/sync/pull'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, validateWith(pullQuerySchema))
  return syncPull(user, query)
})
