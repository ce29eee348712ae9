// Conflicts: a call field changed on the device and on the server from the same base, kept with
// both values until a person settles it, from the office (POST /api/conflicts/[id]/resolve) or
// from the device (a `conflictResolution` op). Both go through resolveConflictInTx.
import { and, desc, eq, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import { callFieldSchemas, type CallSyncField } from '#shared/schemas/sync'
import { fieldErrorsOf, describeFieldErrors } from '#shared/utils/fieldErrors'
import type { Tx } from '../db'
import { callOutcomeProblem, writeCallChanges, type CallRow } from './callWrite'
import { mergeCallField } from './merge'

/** A rule the settlement breaks; the route answers it with `status`, a sync op as `rejected`. */
export class SyncRuleError extends Error {
  constructor(readonly field: string, readonly detail: string, readonly status = 422) {
    super(`${field}: ${detail}`)
  }
}

function ruleFromReason(reason: string, status = 422): SyncRuleError {
  const at = reason.indexOf(': ')
  return at > 0 ? new SyncRuleError(reason.slice(0, at), reason.slice(at + 2), status) : new SyncRuleError('_', reason, status)
}

export type ConflictChoice = 'device' | 'server' | 'value'
export type ConflictRow = typeof tables.conflicts.$inferSelect

export async function resolveConflictInTx(tx: Tx, user: User, conflictId: string, choice: ConflictChoice, value: unknown, opts: { hasValue: boolean }) {
  const { conflicts, calls } = tables
  const [conflict] = await tx.select().from(conflicts).where(eq(conflicts.id, conflictId)).for('update')
  const [call] = conflict ? await tx.select().from(calls).where(eq(calls.id, conflict.callId)).for('no key update') : []
  if (!conflict || !call || (user.role === 'mechanic' && call.mechanicId !== user.id)) {
    throw new SyncRuleError('conflictId', 'no such conflict', 404)
  }
  if (conflict.entity !== 'call') return settleRecordConflict(tx, user, conflict, call, choice)
  const field = conflict.field as CallSyncField
  const schema = callFieldSchemas[field]
  if (!schema) throw new SyncRuleError('conflictId', `settling ${conflict.entity}.${conflict.field} is not supported`)

  let target: unknown
  if (choice === 'server') target = call[field as keyof CallRow]
  else {
    if (choice === 'value' && !opts.hasValue) throw new SyncRuleError('value', 'give the value to keep', 400)
    const parsed = schema.safeParse(choice === 'device' ? conflict.deviceValue : value)
    if (!parsed.success) {
      const fields = fieldErrorsOf(parsed.error)
      throw new SyncRuleError(choice === 'device' ? 'deviceValue' : 'value', describeFieldErrors(fields), 400)
    }
    target = parsed.data
  }

  if (conflict.status === 'resolved') {
    // Settled already: the same decision again is a no-op; a different one must not overturn it.
    if (conflict.choice === choice && JSON.stringify(conflict.resolvedValue ?? null) === JSON.stringify(target ?? null)) return { conflict, call }
    throw new SyncRuleError('conflictId', 'already settled', 409)
  }

  let after: CallRow = call
  if (choice !== 'server') {
    // The person decided: base is taken as the server's value, so only role, lock and order rules remain.
    const current = call[field as keyof CallRow]
    const decision = mergeCallField({ field, device: target, server: current, base: { value: current }, role: user.role, serverStatus: call.status })
    if (decision.action === 'reject') throw ruleFromReason(decision.reason, 403)
    if (decision.action === 'conflict' || decision.action === 'keep') throw ruleFromReason(decision.reason)
    if (decision.action === 'take') {
      const changes = { [field]: target }
      const problem = callOutcomeProblem(call, changes)
      if (problem) throw ruleFromReason(problem)
      after = await writeCallChanges(tx, call, changes, user)
    }
  }
  const [settled] = await tx.update(conflicts).set({
    status: 'resolved', choice, resolvedValue: sql`${JSON.stringify(target ?? null)}::jsonb`, resolvedBy: user.id, resolvedAt: sql`now()`,
  }).where(eq(conflicts.id, conflict.id)).returning()
  return { conflict: settled!, call: after }
}

/**
 * A record's conflict (work sent for a billed call): the record an invoice was priced from stays
 * as it is, so the only settlement is keeping it; the office carries the work to a credit note or
 * a follow-up call.
 */
async function settleRecordConflict(tx: Tx, user: User, conflict: ConflictRow, call: CallRow, choice: ConflictChoice) {
  if (choice !== 'server') {
    throw new SyncRuleError('choice', `the call is ${call.status}; keep the record and add the work to a credit note or a follow-up call`)
  }
  if (conflict.status === 'resolved') {
    if (conflict.choice === choice) return { conflict, call }
    throw new SyncRuleError('conflictId', 'already settled', 409)
  }
  const [settled] = await tx.update(tables.conflicts).set({
    status: 'resolved', choice, resolvedValue: sql`${JSON.stringify(conflict.serverValue ?? null)}::jsonb`,
    resolvedBy: user.id, resolvedAt: sql`now()`,
  }).where(eq(tables.conflicts.id, conflict.id)).returning()
  return { conflict: settled!, call }
}

export async function resolveConflict(user: User, conflictId: string, choice: ConflictChoice, value: unknown, hasValue: boolean) {
  try {
    return await withTxRetry(() => useDb().transaction(tx => resolveConflictInTx(tx, user, conflictId, choice, value, { hasValue })))
  }
  catch (err) {
    if (!(err instanceof SyncRuleError)) throw err
    throw createError({ status: err.status, statusText: err.status === 404 ? 'Not Found' : 'Cannot settle', message: err.message, data: { fields: { [err.field]: err.detail } } })
  }
}

/** Conflicts the user may see: the office roles all, a mechanic those on their own calls. */
export async function listConflicts(user: User, q: { callId?: string, status: 'open' | 'resolved' | 'all' }) {
  const { conflicts, calls, customers } = tables
  const where: SQL[] = []
  if (user.role === 'mechanic') where.push(eq(calls.mechanicId, user.id))
  if (q.callId) where.push(eq(conflicts.callId, q.callId))
  if (q.status !== 'all') where.push(eq(conflicts.status, q.status))
  const rows = await useDb().select({ conflict: conflicts, callNumber: calls.number, callStatus: calls.status, customerName: customers.name })
    .from(conflicts)
    .innerJoin(calls, eq(calls.id, conflicts.callId))
    .innerJoin(customers, eq(customers.id, calls.customerId))
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(conflicts.createdAt))
    .limit(500)
  return { items: rows.map(r => ({ ...publicConflict(r.conflict), callNumber: r.callNumber, callStatus: r.callStatus, customerName: r.customerName })) }
}

export function publicConflict(c: ConflictRow) {
  const { changeXid: _x, ...rest } = c
  return rest
}
