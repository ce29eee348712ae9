import { testCardListQuerySchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, validateWith(testCardListQuerySchema))
  if (query.codes) return suggestTestCardsFor(user, query.codes)
  return listTestCards(user, query)
})
