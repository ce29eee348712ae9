import { and, asc, eq, inArray, ne } from 'drizzle-orm'
import { OPEN_STATUSES } from '#shared/utils/callStatus'

/** The unit's other open calls, oldest first: a second call for one truck is often the same breakdown phoned in twice. */
export async function openCallsOnUnit(unitId: string | null, exceptCallId: string) {
  if (!unitId) return []
  const { calls } = tables
  return useDb().select({ id: calls.id, number: calls.number, status: calls.status })
    .from(calls)
    .where(and(eq(calls.unitId, unitId), inArray(calls.status, [...OPEN_STATUSES]), ne(calls.id, exceptCallId)))
    .orderBy(asc(calls.receivedAt))
}
