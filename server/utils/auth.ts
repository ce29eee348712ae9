import type { H3Event } from 'h3'
import { eq, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'

// Sessions are sealed cookies (nuxt-auth-utils) holding the person and their session epoch at
// sign-in. Every request re-reads the person and the epoch from PostgreSQL, so signing out, a new
// password or turning an account off ends sessions on every device and every app server at once.

/** The person's current session epoch (0 until they first sign out). */
export async function sessionEpochOf(userId: string, db: Db | Tx = useDb()): Promise<number> {
  const row = await db.query.sessionEpochs.findFirst({ where: eq(tables.sessionEpochs.userId, userId) })
  return row?.epoch ?? 0
}

/** Moves the person's epoch on, ending every session sealed before; returns the new epoch. */
export async function endSessionsOf(userId: string, db: Db | Tx = useDb()): Promise<number> {
  const { sessionEpochs } = tables
  const [row] = await db.insert(sessionEpochs).values({ userId, epoch: 1 })
    .onConflictDoUpdate({ target: sessionEpochs.userId, set: { epoch: sql`${sessionEpochs.epoch} + 1`, changedAt: sql`now()` } })
    .returning()
  return row!.epoch
}

/** Seals a fresh session for the person at their current epoch. */
export async function startSession(event: H3Event, user: User) {
  const epoch = await sessionEpochOf(user.id)
  await replaceUserSession(event, { user, loggedInAt: new Date().toISOString(), secure: { epoch } })
}

/**
 * The person the session cookie names, if that session still stands: the account exists, is
 * active, and the epoch sealed at sign-in is still theirs. A session that no longer stands is
 * cleared and answers 'ended'; no session at all answers null.
 */
async function sessionPerson(event: H3Event): Promise<User | 'ended' | null> {
  if (event.context.waysideUser) return event.context.waysideUser as User
  const session = await getUserSession(event)
  if (!session.user?.id) return null
  const { users, sessionEpochs } = tables
  const [row] = await useDb()
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, active: users.active, epoch: sessionEpochs.epoch })
    .from(users).leftJoin(sessionEpochs, eq(sessionEpochs.userId, users.id))
    .where(eq(users.id, session.user.id))
  if (!row || !row.active || (row.epoch ?? 0) !== (session.secure?.epoch ?? 0)) {
    await clearUserSession(event)
    return 'ended'
  }
  const user: User = { id: row.id, email: row.email, name: row.name, role: row.role }
  event.context.waysideUser = user
  return user
}

/** The signed-in user whose session still stands, or null. */
export async function currentUser(event: H3Event): Promise<User | null> {
  const person = await sessionPerson(event)
  return person === 'ended' ? null : person
}

/** The signed-in user, or 401. */
export async function requireUser(event: H3Event): Promise<User> {
  const person = await sessionPerson(event)
  if (person && person !== 'ended') return person
  throw createError({ status: 401, statusText: person === 'ended' ? 'Your session has ended; sign in again' : 'Sign in first' })
}

export async function requireRole(event: H3Event, ...roles: Role[]): Promise<User> {
  const user = await requireUser(event)
  if (!roles.includes(user.role)) throw createError({ status: 403, statusText: 'Your role may not do this' })
  return user
}
