import { idParamsSchema } from '#shared/schemas/users'
import { testCardQuerySchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { version } = await getValidatedQuery(event, validateWith(testCardQuerySchema))
  const card = await getTestCard(id, version)
  if (!card) throw createError({ status: 404, statusText: version ? 'No such card version' : 'No such card' })
  return card
})
