// The settlements stage: a conflict settled from the device (a `conflictResolution` op) goes the
// same way as one settled in the office (resolveConflictInTx); a rule it breaks rejects the op.
import type { CheckedOp } from '#shared/sync/entities'
import { resolveConflictInTx, SyncRuleError } from './conflicts'
import { rejectOp, type ApplyContext, type OpOutcome } from './context'

type Settlement = Extract<CheckedOp, { kind: 'command' }>

export async function applySettlement(ctx: ApplyContext, op: Settlement): Promise<OpOutcome> {
  const { conflictId, choice, value } = op.data
  try {
    const { conflict, call } = await resolveConflictInTx(ctx.tx, ctx.user, conflictId, choice, value, { hasValue: op.hasValue })
    ctx.calls.set(call.id, call)
    return { status: 'applied', version: conflict.version }
  }
  catch (err) {
    if (err instanceof SyncRuleError) return rejectOp(err.message)
    throw err
  }
}
