import { idParamsSchema } from '#shared/schemas/users'
import { putPhotoBytes } from '../../utils/sync/photos'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  return putPhotoBytes(event, id)
})
