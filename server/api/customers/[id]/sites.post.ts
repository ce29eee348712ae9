import { siteCreateSchema } from '#shared/schemas/customers'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(siteCreateSchema))
  if (!(await getCustomer(id))) throw createError({ status: 404, statusText: 'Customer not found' })
  const site = await addSite(id, input)
  setResponseStatus(event, 201)
  return site
})
