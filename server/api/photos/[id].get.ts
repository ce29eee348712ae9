import { idParamsSchema } from '#shared/schemas/users'
import { getPhotoBytes } from '../../utils/sync/photos'

export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  return getPhotoBytes(event, id)
})
