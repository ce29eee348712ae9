import { eq } from 'drizzle-orm'
import { photoMarkSchema } from '#shared/schemas/invoices'
import { idParamsSchema } from '#shared/schemas/users'

// The office marks a photo for the customer; marked photos print on the invoice.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { showCustomer } = await readValidatedBody(event, validateWith(photoMarkSchema))
  const [photo] = await useDb().update(tables.photos).set({ showCustomer }).where(eq(tables.photos.id, id))
    .returning({ id: tables.photos.id, showCustomer: tables.photos.showCustomer })
  if (!photo) throw createError({ status: 404, statusText: 'No such photo' })
  return photo
})
