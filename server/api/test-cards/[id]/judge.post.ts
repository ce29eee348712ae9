import { idParamsSchema } from '#shared/schemas/users'
import { testCardJudgeSchema } from '#shared/schemas/testCards'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(testCardJudgeSchema))
  const answer = await judgeTestCardStep(id, input)
  if (!answer) throw createError({ status: 404, statusText: input.version ? 'No such card version' : 'No such card' })
  return answer
})
