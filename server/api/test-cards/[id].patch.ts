import { idParamsSchema } from '#shared/schemas/users'
import { testCardPatchSchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(testCardPatchSchema))
  const card = await updateTestCard(id, patch, user)
  if (!card) throw createError({ status: 404, statusText: 'No such card' })
  return card
})
