import { conflictResolveBodySchema } from '#shared/schemas/sync'
import { idParamsSchema } from '#shared/schemas/users'
import { publicConflict, resolveConflict } from '../../../utils/sync/conflicts'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const body = await readValidatedBody(event, validateWith(conflictResolveBodySchema))
  const { conflict, call } = await resolveConflict(user, id, body.choice, body.value, 'value' in body)
  return { conflict: publicConflict(conflict), call: { id: call.id, version: call.version, status: call.status } }
})
