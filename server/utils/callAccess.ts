import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'

export type CallRecord = typeof tables.calls.$inferSelect

/** Whether the user may read and write this call: a mechanic only their own, the office all. */
export function mayAccessCall(user: Pick<User, 'id' | 'role'>, call: Pick<CallRecord, 'mechanicId'>): boolean {
  return user.role !== 'mechanic' || call.mechanicId === user.id
}

/** The signed-in user and the call, or 404 when there is no such call or it is not theirs to see. */
export async function requireCallAccess(event: H3Event, callId: string): Promise<{ user: User; call: CallRecord }> {
  const user = await requireUser(event)
  const call = await useDb().query.calls.findFirst({ where: eq(tables.calls.id, callId) })
  if (!call || !mayAccessCall(user, call)) throw createError({ status: 404, statusText: 'Call not found' })
  return { user, call }
}
