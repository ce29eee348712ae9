import { truckCreateSchema } from '#shared/schemas/stock'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const input = await readValidatedBody(event, validateWith(truckCreateSchema))
  const truck = await createTruck(input)
  setResponseStatus(event, 201)
  return truck
})
