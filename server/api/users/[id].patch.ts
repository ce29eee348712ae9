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
  if (password) {
    // The person's own name and e-mail are the first things a guesser tries.
    const person = await useDb().query.users.findFirst({ where: eq(tables.users.id, id) })
    const problem = person && passwordProblem(password, [person.name, person.email, patch.name])
    if (problem) ruleError('password', problem)
  }
  const passwordHash = password ? await hashPassword(password) : undefined
  // A new password or turning the account off ends the person's sessions everywhere, in the
  // same transaction as the change.
  const row = await useDb().transaction(async (tx) => {
    const [updated] = await tx.update(tables.users).set({ ...rest, ...(passwordHash ? { passwordHash } : {}) })
      .where(eq(tables.users.id, id)).returning()
    if (updated && (passwordHash || patch.active === false)) await endSessionsOf(id, tx)
    return updated
  })
  if (!row) throw createError({ status: 404, statusText: 'No such person' })
  // An admin who set their own password stays signed in here, on the new epoch.
  if (passwordHash && id === admin.id) await startSession(event, admin)
  return publicUser(row)
})
