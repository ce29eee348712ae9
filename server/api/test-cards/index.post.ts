import { testCardCreateSchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'admin')
  const input = await readValidatedBody(event, validateWith(testCardCreateSchema))
  const card = await createTestCard(input, user)
  setResponseStatus(event, 201)
  return card
})
