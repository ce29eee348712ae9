// The updates stage. A call update is merged field by field, three ways (merge.ts): each field is
// taken, kept as it is, refused, or raised as a conflict (raiseConflicts, the one way); what is
// taken is written through writeCallChanges, which moves a status with the call module. A record
// that changes in place (a fault code, a test run) is written as sent, unless its call is billed.
import { eq } from 'drizzle-orm'
import type { Op } from '#shared/schemas/sync'
import type { UpdatableEntityName } from '#shared/sync/entities'
import { isBilledStatus } from '#shared/utils/callStatus'
import { billedUpdate } from './billed'
import { callOutcomeProblem, writeCallChanges, type CallRow } from './callWrite'
import { raiseConflicts, type RaisedConflict } from './conflicts'
import { entityWord, FORBIDDEN, rejectOp, type ApplyContext, type OpOutcome } from './context'
import { mergeCallField } from './merge'
import { toSyncDate } from './rows'
import { RECORD_TABLES } from './tables'

export async function applyCallUpdate(ctx: ApplyContext, op: Op, changes: Record<string, unknown>): Promise<OpOutcome> {
  const call = ctx.calls.get(op.entityId)
  const problem = ctx.accessProblem(call)
  if (problem || !call) return rejectOp(problem === 'callId: no such call' ? 'entityId: no such call' : FORBIDDEN)
  const base = op.base ?? {}
  const takes: Record<string, unknown> = {}
  const rejects: string[] = []
  const notes: string[] = []
  const conflicts: RaisedConflict[] = []
  const conflict = (field: string, reason: string, device: unknown, server: unknown) => {
    notes.push(reason)
    conflicts.push({
      callId: call.id, entity: 'call', entityId: call.id, field, reason, opId: op.opId, raisedBy: ctx.user.id,
      base: { value: field in base ? base[field] : null }, device, server,
    })
  }
  for (const [field, device] of Object.entries(changes)) {
    const server = call[field as keyof CallRow]
    const d = mergeCallField({
      field, device, server, role: ctx.user.role, serverStatus: call.status,
      base: field in base ? { value: base[field] } : undefined,
      baseVersionMatches: op.baseVersion !== undefined && op.baseVersion === call.version,
    })
    if (d.action === 'take') takes[field] = d.value
    else if (d.action === 'reject') rejects.push(d.reason)
    else if (d.action === 'keep') notes.push(d.reason)
    else if (d.action === 'conflict') conflict(field, d.reason, device, server)
  }
  if (rejects.length) return rejectOp(rejects.join('; '))
  const outcomeProblem = callOutcomeProblem(call, takes)
  if (outcomeProblem) {
    // The device completed the call but its status move did not take: the outcome waits with it.
    if (!('outcome' in takes) || !('status' in changes) || takes.status !== undefined) return rejectOp(outcomeProblem)
    conflict('outcome', 'outcome: the call was not completed on the server', takes.outcome, call.outcome)
    delete takes.outcome
  }
  let after = call
  if (Object.keys(takes).length) after = await writeCallChanges(ctx.tx, call, takes, ctx.user, { deviceAt: new Date(op.at) })
  await raiseConflicts(ctx.tx, conflicts)
  ctx.calls.set(after.id, after)
  const reason = notes.length ? notes.join('; ') : undefined
  return { status: conflicts.length ? 'conflict' : 'applied', version: after.version, ...(reason ? { reason } : {}) }
}

/** Fault codes and test runs change in place; only their call's writers reach them. */
export async function applyRecordUpdate(
  ctx: ApplyContext, op: Op, entity: Exclude<UpdatableEntityName, 'call'>, changes: Record<string, unknown>,
): Promise<OpOutcome> {
  const table = RECORD_TABLES[entity]
  const [row] = await ctx.tx.select().from(table).where(eq(table.id, op.entityId)).for('update') as Record<string, unknown>[]
  if (!row) return rejectOp(`entityId: no such ${entityWord(entity)}`)
  const call = await ctx.callOf(row.callId as string)
  const problem = ctx.accessProblem(call)
  if (problem) return rejectOp(problem === FORBIDDEN ? FORBIDDEN : 'entityId: no such call')
  if (isBilledStatus(call!.status)) return billedUpdate(ctx, op, entity, call!, row, changes)
  const set: Record<string, unknown> = { ...changes }
  for (const k of ['clearedAt', 'finishedAt']) if (k in set) set[k] = toSyncDate(set[k])
  const [out] = await ctx.tx.update(table).set(set as never).where(eq(table.id, op.entityId)).returning({ version: table.version })
  return { status: 'applied', version: (out as { version: number }).version }
}
