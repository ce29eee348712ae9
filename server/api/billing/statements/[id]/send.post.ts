import { statementSendSchema } from '#shared/schemas/statements'
import { idParamsSchema } from '#shared/schemas/users'

// Queues the statement e-mail and answers at once; the job makes the PDF and sends it with retries.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const body = await readValidatedBody(event, validateWith(statementSendSchema.default({})))
  const statement = await customerStatement(id)
  if (!statement) throw createError({ status: 404, statusText: 'No such customer' })
  const to = body.to ?? statement.customer.billingEmail
  if (!to) ruleError('to', `${statement.customer.name} has no billing e-mail; add one on the customer or give an address`)
  const mail = await queueStatementMail(statement, to, user)
  setResponseStatus(event, 202)
  return { mail, to }
})
