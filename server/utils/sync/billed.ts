// Work sent for an invoiced or paid call: kept as a conflict for the office (to add to a credit
// note or a follow-up call), never added to the record the invoice was priced from. Sent again,
// the same record is the same conflict; a record stored before the call was billed is a repeat.
import { and, eq } from 'drizzle-orm'
import type { Op } from '#shared/schemas/sync'
import type { RecordEntityName } from '#shared/sync/entities'
import type { CallRow } from './callWrite'
import { raiseConflicts } from './conflicts'
import { entityWord, rejectOp, type ApplyContext, type OpOutcome } from './context'
import { sameRecordContent } from './creates'
import { sameSyncValue } from './merge'
import { buildCreateRow } from './rows'
import { RECORD_TABLES } from './tables'

/** Why new work waits for the office: an invoice was priced from the call's record. */
export function billedReason(field: string, status: string, what: string) {
  return `${field}: the call is ${status}; ${what}`
}

/** A new record for a billed call: one conflict on its `callId`, whatever the record. */
export async function billedCreate(ctx: ApplyContext, op: Op, entity: RecordEntityName, data: Record<string, unknown>): Promise<OpOutcome> {
  const call = ctx.calls.get(data.callId as string)!
  const table = RECORD_TABLES[entity]
  const [there] = await ctx.tx.select({ id: table.id }).from(table).where(eq(table.id, op.entityId))
  if (there) return repeatOfStored(ctx, entity, op, data)
  const what = `the ${entityWord(entity)} is kept for the office to add to a credit note or a follow-up call`
  const reason = billedReason('callId', call.status, what)
  const { conflicts } = tables
  const [kept] = await ctx.tx.select({ id: conflicts.id }).from(conflicts)
    .where(and(eq(conflicts.entity, entity), eq(conflicts.entityId, op.entityId), eq(conflicts.field, 'callId')))
  if (!kept) {
    await raiseConflicts(ctx.tx, [{
      callId: call.id, entity, entityId: op.entityId, field: 'callId', reason, opId: op.opId, raisedBy: ctx.user.id,
      device: data, server: null,
    }])
  }
  return { status: 'conflict', reason }
}

/** A create whose record is stored already (made before the call was billed): the same content is a no-op. */
async function repeatOfStored(ctx: ApplyContext, entity: RecordEntityName, op: Op, data: Record<string, unknown>): Promise<OpOutcome> {
  const built = buildCreateRow(ctx, entity, op, data)
  if (typeof built === 'string') return rejectOp(built)
  const table = RECORD_TABLES[entity]
  const [row] = await ctx.tx.select().from(table).where(eq(table.id, op.entityId)) as Record<string, unknown>[]
  if (!sameRecordContent(built, row!)) return rejectOp(`entityId: a different ${entityWord(entity)} already has this id`)
  return { status: 'applied', version: (row!.version as number) ?? 1 }
}

/** A change to a record of a billed call: each changed field kept as a conflict, the record unchanged. */
export async function billedUpdate(
  ctx: ApplyContext, op: Op, entity: RecordEntityName, call: CallRow, row: Record<string, unknown>, changes: Record<string, unknown>,
): Promise<OpOutcome> {
  const fields = Object.keys(changes).filter(f => !sameSyncValue(changes[f], row[f]))
  if (!fields.length) return { status: 'applied', version: row.version as number }
  const base = op.base ?? {}
  const reasons = fields.map(f => billedReason(f, call.status, 'kept for the office'))
  await raiseConflicts(ctx.tx, fields.map((field, i) => ({
    callId: call.id, entity, entityId: op.entityId, field, reason: reasons[i]!, opId: op.opId, raisedBy: ctx.user.id,
    base: { value: field in base ? base[field] : null }, device: changes[field], server: row[field],
  })))
  return { status: 'conflict', version: row.version as number, reason: reasons.join('; ') }
}
