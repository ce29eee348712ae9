import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'

/**
 * The signed-in user, re-read from the database on every request so that a deactivated
 * account or a changed role takes effect at once, whatever the sealed cookie still says.
 */
export async function requireUser(event: H3Event): Promise<User> {
  if (event.context.waysideUser) return event.context.waysideUser as User
  const session = await getUserSession(event)
  if (!session.user?.id) throw createError({ status: 401, statusText: 'Sign in first' })
  const row = await useDb().query.users.findFirst({ where: eq(tables.users.id, session.user.id) })
  if (!row || !row.active) {
    await clearUserSession(event)
    throw createError({ status: 401, statusText: 'This account can no longer sign in' })
  }
  const user: User = { id: row.id, email: row.email, name: row.name, role: row.role }
  event.context.waysideUser = user
  return user
}

export async function requireRole(event: H3Event, ...roles: Role[]): Promise<User> {
  const user = await requireUser(event)
  if (!roles.includes(user.role)) throw createError({ status: 403, statusText: 'Your role may not do this' })
  return user
}
