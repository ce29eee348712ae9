// The one write path for call fields changed by sync or by settling a conflict: status moves
// stamp their time with the server's clock and leave a call_events row for the timeline.
import { eq, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { CallStatus } from '#shared/schemas/calls'
import type { CallSyncField } from '#shared/schemas/sync'
import type { Tx } from '../db'

export type CallRow = typeof tables.calls.$inferSelect

const STATUS_TIME: Partial<Record<CallStatus, keyof CallRow>> = {
  assigned: 'assignedAt',
  en_route: 'enRouteAt',
  on_site: 'onSiteAt',
  completed: 'completedAt',
  invoiced: 'invoicedAt',
  paid: 'paidAt',
  cancelled: 'cancelledAt',
}

const DONE: readonly CallStatus[] = ['completed', 'invoiced', 'paid']

/** The outcome rule of the calls table, checked before writing so it answers with the field. */
export function outcomeProblem(call: CallRow, changes: Partial<Record<CallSyncField, unknown>>): string | undefined {
  const status = (changes.status ?? call.status) as CallStatus
  const outcome = 'outcome' in changes ? changes.outcome : call.outcome
  if (outcome != null && !DONE.includes(status)) return 'outcome: a call gets its outcome once the work is done'
  return undefined
}

export async function writeCallChanges(tx: Tx, call: CallRow, changes: Partial<Record<CallSyncField, unknown>>, user: User): Promise<CallRow> {
  const set: Record<string, unknown> = { ...changes }
  const to = changes.status as CallStatus | undefined
  const moved = to !== undefined && to !== call.status
  if (moved) {
    const column = STATUS_TIME[to]
    if (column) set[column] = sql`now()`
    set.statusChangedAt = sql`now()`
  }
  const [row] = await tx.update(tables.calls).set(set).where(eq(tables.calls.id, call.id)).returning()
  if (!row) throw new Error(`call ${call.id} vanished while it was locked`)
  if (moved) {
    await tx.insert(tables.callEvents).values({ callId: call.id, kind: 'status', fromStatus: call.status, toStatus: to, byUserId: user.id })
  }
  return row
}
