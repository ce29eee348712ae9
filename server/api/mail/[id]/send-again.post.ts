import { eq } from 'drizzle-orm'
import { idParamsSchema } from '#shared/schemas/users'

// "Send again" on a message that failed or waits for a retry: back in the queue now.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const [row] = await useDb().select({ type: tables.mailLog.relatedType }).from(tables.mailLog).where(eq(tables.mailLog.id, id))
  if (!row) throw createError({ status: 404, statusText: 'No such message' })
  if (row.type === 'invoice' && user.role === 'dispatcher') throw createError({ status: 403, statusText: 'Invoice mail is the office\'s' })
  await requeueMail(id, user)
  return { queued: true }
})
