import { unitCreateSchema } from '#shared/schemas/units'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const input = await readValidatedBody(event, validateWith(unitCreateSchema))
  const unit = await createUnitFor(input)
  setResponseStatus(event, 201)
  return unit
})
