// The call module's one way to open a call and to move its status (its pure rules are in
// shared/utils/callStatus.ts). A move sets the status, stamps when it happened in that status's time
// column, and writes the timeline entry with the same time; the entry's created_at is when the
// server learned it. Dispatch, invoicing, payments, sync and conflict settling all move calls here;
// whether a move is allowed is the caller's rule, checked before.
import { and, eq } from 'drizzle-orm'
import { statusTimes, type CallStatus } from '#shared/utils/callStatus'
import type { Tx } from './db'

type CallRow = typeof tables.calls.$inferSelect
type CallSet = Partial<typeof tables.calls.$inferInsert>

export interface CallMove {
  to: CallStatus
  /** Who moved it; null for the payment provider's webhook. */
  by: string | null
  /** When it happened: the server's now unless the move was made on a phone (bounded by the caller). */
  at?: Date
  /** The timeline entry's kind: a plain move, or an assignment (which names the mechanic). */
  kind?: 'status' | 'assigned'
  mechanicId?: string | null
  note?: string | null
  /** Other columns written in the same update: the mechanic, a cancel reason, the fields a sync op changed. */
  also?: CallSet
}

/**
 * Moves `call` from the status it was read in to `move.to`, inside the caller's transaction.
 * Returns the updated row, or undefined when the call had already left that status (a lost race).
 */
export async function moveCallStatus(tx: Tx, call: Pick<CallRow, 'id' | 'status'>, move: CallMove): Promise<CallRow | undefined> {
  const at = move.at ?? new Date()
  const [row] = await tx.update(tables.calls)
    .set({ ...move.also, status: move.to, ...statusTimes(call.status, move.to, at) })
    .where(and(eq(tables.calls.id, call.id), eq(tables.calls.status, call.status))).returning()
  if (!row) return undefined
  await tx.insert(tables.callEvents).values({
    callId: call.id, kind: move.kind ?? 'status', fromStatus: call.status, toStatus: move.to,
    mechanicId: move.mechanicId ?? null, byUserId: move.by, note: move.note ?? null, at,
  })
  return row
}

/** Opens a call as `received`, with its first timeline entry; the only other place a call's status is written. */
export async function openCall(tx: Tx, values: Omit<typeof tables.calls.$inferInsert, 'status'>, by: string): Promise<CallRow> {
  const at = new Date()
  const [row] = await tx.insert(tables.calls).values({
    ...values, status: 'received', receivedAt: at, statusChangedAt: at, createdBy: by,
  }).returning()
  await tx.insert(tables.callEvents).values({ callId: row!.id, kind: 'status', toStatus: 'received', byUserId: by, at })
  return row!
}
