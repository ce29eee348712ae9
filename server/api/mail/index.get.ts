import { mailListQuerySchema } from '#shared/schemas/mail'

// The e-mail about one record (an invoice, a call), with how each message went.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { relatedId } = await getValidatedQuery(event, validateWith(mailListQuerySchema))
  const type = await mailRelatedType(relatedId)
  if (type === 'invoice' && user.role === 'dispatcher') throw createError({ status: 403, statusText: 'Invoice mail is the office\'s' })
  return { items: await mailFor(relatedId) }
})
