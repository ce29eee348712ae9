import { testCardListQuerySchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, validateWith(testCardListQuerySchema))
  return listTestCards(user, query)
})
