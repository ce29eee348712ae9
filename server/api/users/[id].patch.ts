import { eq } from 'drizzle-orm'
import { idParamsSchema, userPatchSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(userPatchSchema))
  if (id === admin.id && (patch.active === false || (patch.role && patch.role !== 'admin'))) {
    ruleError(patch.active === false ? 'active' : 'role', 'You cannot lock yourself out; ask another admin')
  }
  if (patch.homeTruckId) await checkHomeTruck(id, patch.homeTruckId)
  const { password, ...rest } = patch
  const [row] = await useDb().update(tables.users)
    .set({ ...rest, ...(password ? { passwordHash: await hashPassword(password) } : {}) })
    .where(eq(tables.users.id, id)).returning()
  if (!row) throw createError({ status: 404, statusText: 'No such person' })
  return publicUser(row)
})
