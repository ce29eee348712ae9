// The one write path for call fields changed by sync or by settling a conflict: status moves
// stamp their time with the server's clock and leave a call_events row for the timeline.
import { eq, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { outcomeProblem, STATUS_TIME_FIELD, type CallStatus } from '#shared/utils/callStatus'
import type { CallSyncField } from '#shared/schemas/sync'
import type { Tx } from '../db'

export type CallRow = typeof tables.calls.$inferSelect

/** The outcome rule of the calls table, checked before writing so it answers with the field. */
export function callOutcomeProblem(call: CallRow, changes: Partial<Record<CallSyncField, unknown>>): string | undefined {
  return outcomeProblem((changes.status ?? call.status) as CallStatus, 'outcome' in changes ? changes.outcome : call.outcome)
}

export async function writeCallChanges(tx: Tx, call: CallRow, changes: Partial<Record<CallSyncField, unknown>>, user: User): Promise<CallRow> {
  const set: Record<string, unknown> = { ...changes }
  const to = changes.status as CallStatus | undefined
  const moved = to !== undefined && to !== call.status
  if (moved) {
    set[STATUS_TIME_FIELD[to]] = sql`now()`
    set.statusChangedAt = sql`now()`
  }
  const [row] = await tx.update(tables.calls).set(set).where(eq(tables.calls.id, call.id)).returning()
  if (!row) throw new Error(`call ${call.id} vanished while it was locked`)
  if (moved) {
    await tx.insert(tables.callEvents).values({ callId: call.id, kind: 'status', fromStatus: call.status, toStatus: to, byUserId: user.id })
  }
  return row
}
