import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'

/**
 * The signed-in user and the call they ask for. A mechanic only reaches calls assigned to them;
 * anyone else's call answers 404, the same as a call that does not exist, so ids cannot be probed.
 */
export async function requireCallAccess(event: H3Event, callId: string): Promise<{ user: User, call: typeof tables.calls.$inferSelect }> {
  const user = await requireUser(event)
  const call = await useDb().query.calls.findFirst({ where: eq(tables.calls.id, callId) })
  if (!call || (user.role === 'mechanic' && call.mechanicId !== user.id)) {
    throw createError({ status: 404, statusText: 'Call not found' })
  }
  return { user, call }
}
