// Applies a push's fresh ops inside the push transaction, stage by stage:
//   1. parse    each op against its entity's schema in the registry (checkOp, shared/sync/entities.ts)
//   2. load     the calls the ops touch (locked) and the rows they point at (context.ts)
//   3. creates  buffered per entity, written with one multi-row INSERT each (creates.ts, rows.ts)
//   4. updates  of a call, merged field by field, and of records changed in place (updates.ts)
//   5. settlements of conflicts sent from the device (settle.ts)
//   6. billed   work sent for an invoiced or paid call, kept as conflicts (billed.ts)
// Buffered creates are written before any update, so an update sees the rows created before it.
// How writes run (the fast pass or the careful rerun) is the strategy's (strategy.ts).
import type { SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { Op } from '#shared/schemas/sync'
import { checkOp, type RecordEntityName } from '#shared/sync/entities'
import { isBilledStatus } from '#shared/utils/callStatus'
import type { Tx } from '../db'
import { billedCreate } from './billed'
import { ApplyContext, loadApplyContext, rejectOp, type OpOutcome } from './context'
import { CreateStage } from './creates'
import { applySettlement } from './settle'
import type { ApplyStrategy } from './strategy'
import { applyCallUpdate, applyRecordUpdate } from './updates'

type Billed = { index: number, op: Op, entity: RecordEntityName, data: Record<string, unknown> }

/**
 * The outcome of each op, and the statements the push's closing statement must run with its stored
 * results: under the fast strategy, the creates left at the end; under the careful one, none.
 */
export async function applySyncOps(
  tx: Tx, user: User, ops: Op[], limits: { photoMaxBytes: number }, strategy: ApplyStrategy,
): Promise<{ outcomes: OpOutcome[], closing: SQL[] }> {
  const parsed = ops.map(checkOp)
  const ctx = await loadApplyContext(new ApplyContext(tx, user, limits, strategy), ops, parsed)
  const outcomes: OpOutcome[] = ops.map(() => ({ status: 'rejected' }))
  const creates = new CreateStage(ctx, outcomes)
  const billed: Billed[] = []

  for (let i = 0; i < ops.length; i++) {
    const p = parsed[i]!
    const op = ops[i]!
    if (!p.ok) outcomes[i] = rejectOp(p.reason)
    else if (p.kind === 'create') {
      const call = ctx.calls.get(p.data.callId as string)
      const problem = ctx.accessProblem(call)
      if (problem) outcomes[i] = rejectOp(problem)
      else if (isBilledStatus(call!.status)) billed.push({ index: i, op, entity: p.entity, data: p.data })
      else creates.queue(i, op, p.entity, p.data)
    }
    else {
      await creates.write()
      outcomes[i] = await ctx.guardOp(op.changes, () => {
        if (p.kind === 'command') return applySettlement(ctx, p)
        if (p.entity === 'call') return applyCallUpdate(ctx, op, p.data)
        return applyRecordUpdate(ctx, op, p.entity, p.data)
      })
    }
  }
  for (const b of billed) outcomes[b.index] = await ctx.guardOp(b.op.changes, () => billedCreate(ctx, b.op, b.entity, b.data))
  if (!strategy.defersCreates) {
    await creates.write()
    return { outcomes, closing: [] }
  }
  return { outcomes, closing: await creates.closingInserts() }
}
