import { idParamsSchema } from '#shared/schemas/users'
import { shareCreateSchema } from '#shared/schemas/share'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { sendTo } = await readValidatedBody(event, validateWith(shareCreateSchema))
  const { call } = await requireCallAccess(event, id)
  return makeStatusLink(call, user, sendTo)
})
