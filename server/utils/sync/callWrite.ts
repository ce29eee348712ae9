// The one write path for call fields changed by sync or by settling a conflict. A status move
// stamps when it happened (the phone's time for a move made there, kept between the call's last
// move and the server's now) and leaves a call_events row for the timeline; the row's created_at
// is when the server learned it. Transaction order still decides merging.
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { boundedMoveTime } from '#shared/sync/clockBounds'
import { outcomeProblem, STATUS_TIME_FIELD, type CallStatus } from '#shared/utils/callStatus'
import type { CallSyncField } from '#shared/schemas/sync'
import type { Tx } from '../db'

export type CallRow = typeof tables.calls.$inferSelect

/** The outcome rule of the calls table, checked before writing so it answers with the field. */
export function callOutcomeProblem(call: CallRow, changes: Partial<Record<CallSyncField, unknown>>): string | undefined {
  return outcomeProblem((changes.status ?? call.status) as CallStatus, 'outcome' in changes ? changes.outcome : call.outcome)
}

/** When a move happened: the device's time when it was made on a phone, never before the call's last move nor after now. */
export function moveTime(call: CallRow, deviceAt?: Date, now = new Date()): Date {
  if (!deviceAt) return now
  const last = call[STATUS_TIME_FIELD[call.status]] ?? call.statusChangedAt ?? call.receivedAt
  return boundedMoveTime(deviceAt, { after: last, now })
}

export async function writeCallChanges(
  tx: Tx, call: CallRow, changes: Partial<Record<CallSyncField, unknown>>, user: User, opts: { deviceAt?: Date } = {},
): Promise<CallRow> {
  const set: Record<string, unknown> = { ...changes }
  const to = changes.status as CallStatus | undefined
  const moved = to !== undefined && to !== call.status
  const at = moveTime(call, opts.deviceAt)
  if (moved) {
    set[STATUS_TIME_FIELD[to]] = at
    set.statusChangedAt = at
  }
  const [row] = await tx.update(tables.calls).set(set).where(eq(tables.calls.id, call.id)).returning()
  if (!row) throw new Error(`call ${call.id} vanished while it was locked`)
  if (moved) {
    const event = { callId: call.id, kind: 'status', fromStatus: call.status, toStatus: to, byUserId: user.id, at }
    await tx.insert(tables.callEvents).values(event)
  }
  return row
}
