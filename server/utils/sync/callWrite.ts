// The one write path for call fields changed by sync or by settling a conflict. A status move
// goes through the call module's moveCallStatus (server/utils/callMove.ts) with when it happened:
// the phone's time for a move made there, kept between the call's last move and the server's now.
// Transaction order still decides merging.
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { boundedMoveTime } from '#shared/sync/clockBounds'
import { outcomeProblem, STATUS_TIME_FIELD, type CallStatus } from '#shared/utils/callStatus'
import type { CallSyncField } from '#shared/schemas/sync'
import type { Tx } from '../db'
import { moveCallStatus } from '../callMove'
import { raiseUnitReadings } from '../truckReadings'

export type CallRow = typeof tables.calls.$inferSelect

/** The outcome rule of the calls table, checked before writing so it answers with the field. */
export function callOutcomeProblem(call: CallRow, changes: Partial<Record<CallSyncField, unknown>>): string | undefined {
  return outcomeProblem((changes.status ?? call.status) as CallStatus, 'outcome' in changes ? changes.outcome : call.outcome)
}

/** When a move happened: the device's time when it was made on a phone, never before the call's last move nor after now. */
export function moveTime(call: CallRow, deviceAt?: Date, now = new Date()): Date {
  if (!deviceAt) return now
  // The later of the two: a paused call is back at assigned, but its last move was the pause.
  const stamped = call[STATUS_TIME_FIELD[call.status]]
  const last = stamped && call.statusChangedAt
    ? new Date(Math.max(stamped.getTime(), call.statusChangedAt.getTime()))
    : stamped ?? call.statusChangedAt ?? call.receivedAt
  return boundedMoveTime(deviceAt, { after: last, now })
}

export async function writeCallChanges(
  tx: Tx, call: CallRow, changes: Partial<Record<CallSyncField, unknown>>, user: User, opts: { deviceAt?: Date } = {},
): Promise<CallRow> {
  const { status: to, ...rest } = changes as Partial<Record<CallSyncField, unknown>> & { status?: CallStatus }
  const also = rest as Partial<CallRow>
  const moving = to !== undefined && to !== call.status
  if (!moving && !Object.keys(also).length) return call
  const row = moving
    ? await moveCallStatus(tx, call, { to, by: user.id, at: moveTime(call, opts.deviceAt), also })
    : (await tx.update(tables.calls).set(also).where(eq(tables.calls.id, call.id)).returning())[0]
  if (!row) throw new Error(`call ${call.id} left its status while it was locked`)
  await raiseUnitReadings(tx, row.unitId, also)
  return row
}
