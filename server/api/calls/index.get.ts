import { callListQuerySchema } from '#shared/schemas/calls'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, validateWith(callListQuerySchema))
  return listCalls(user, query)
})
