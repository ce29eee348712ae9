// What an applying push knows: who pushes, the server's now, its strategy, the calls its ops touch
// (locked, in id order, so concurrent pushes take the locks alike) and the rows they point at,
// read in a few queries up front.
import { eq, inArray, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { Op } from '#shared/schemas/sync'
import { SYNC_ENTITIES, type CheckedOp, type RecordEntityName } from '#shared/sync/entities'
import type { ClockKind } from '#shared/utils/clockSpans'
import type { Tx } from '../db'
import type { CallRow } from './callWrite'
import { isDataRefusal, refusalReason, type ApplyStrategy } from './strategy'

export type OpOutcome = { status: 'applied' | 'conflict' | 'rejected', version?: number, reason?: string }

export const rejectOp = (reason: string): OpOutcome => ({ status: 'rejected', reason })
export const FORBIDDEN = 'forbidden'
/** "reading", "part line": the registry's word for one record of the entity. */
export const entityWord = (entity: RecordEntityName) => SYNC_ENTITIES[entity].words.one
/** A value for a jsonb column that keeps JSON null and strings as JSON. */
export const jsonbValue = (v: unknown) => sql`${JSON.stringify(v ?? null)}::jsonb`

/** A clock event as the bounds judge it: its device time, and the server's flag once it has one. */
export type ClockSeen = { id: string, kind: ClockKind, at: Date, flag: string | null }

/** Rows the push's ops point at. */
export interface ApplyRefs {
  testRuns: Map<string, string> // id → callId (in the database or created earlier in this push)
  cardVersions: Set<string> // `${cardId}:${version}`
  trucks: Set<string>
  stock: Map<string, { unitPriceCents: number, coreChargeCents: number }> // `${truckId}:${partNumber}`
  signedCalls: Map<string, string> // callId → sign-off id
  clock: Map<string, ClockSeen[]> // callId → its clock events (stored, and queued in this push)
}

export class ApplyContext {
  /** The server's now for this push: the upper bound of a phone's clock. */
  readonly now = new Date()
  calls = new Map<string, CallRow>()
  readonly refs: ApplyRefs = {
    testRuns: new Map(), cardVersions: new Set(), trucks: new Set(), stock: new Map(), signedCalls: new Map(), clock: new Map(),
  }

  constructor(readonly tx: Tx, readonly user: User, readonly limits: { photoMaxBytes: number }, readonly strategy: ApplyStrategy) {}

  clockOf(callId: string): ClockSeen[] {
    let list = this.refs.clock.get(callId)
    if (!list) this.refs.clock.set(callId, list = [])
    return list
  }

  /** The call of a record an op changes in place; read, not locked (the record's row is). */
  async callOf(id: string): Promise<CallRow | undefined> {
    const known = this.calls.get(id)
    if (known) return known
    const [row] = await this.tx.select().from(tables.calls).where(eq(tables.calls.id, id))
    return row
  }

  /** A reason to refuse the user this call, or undefined when they may write to it. */
  accessProblem(call: CallRow | undefined): string | undefined {
    if (this.user.role === 'mechanic') return call && call.mechanicId === this.user.id ? undefined : FORBIDDEN
    return call ? undefined : 'callId: no such call'
  }

  /** One write, as the strategy runs it. */
  guard<T>(fn: () => Promise<T>): Promise<T> {
    return this.strategy.guard(this.tx, fn)
  }

  /** One op, as the strategy runs it: carefully, a row the database refuses rejects that op and keeps the rest. */
  async guardOp(values: Record<string, unknown>, fn: () => Promise<OpOutcome>): Promise<OpOutcome> {
    const before = new Map(this.calls)
    try {
      return await this.guard(fn)
    }
    catch (err) {
      if (this.strategy.name !== 'careful' || !isDataRefusal(err)) throw err
      this.calls = before
      return rejectOp(refusalReason(err, values))
    }
  }
}

/** Reads (and locks) what the ops point at, in one query per kind of row. */
export async function loadApplyContext(ctx: ApplyContext, ops: Op[], parsed: CheckedOp[]): Promise<ApplyContext> {
  const { tx, refs } = ctx
  const callIds = new Set<string>()
  const runIds = new Set<string>()
  const cardIds = new Set<string>()
  const truckIds = new Set<string>()
  const signCalls = new Set<string>()
  const clockCalls = new Set<string>()
  const conflictIds: string[] = []
  parsed.forEach((p, i) => {
    if (!p.ok) return
    if (p.kind === 'create') {
      callIds.add(p.data.callId as string)
      if (p.entity === 'reading' && p.data.testRunId) runIds.add(p.data.testRunId as string)
      if (p.entity === 'testRun') cardIds.add(p.data.cardId as string)
      if (p.entity === 'partLine' && p.data.serviceTruckId) truckIds.add(p.data.serviceTruckId as string)
      if (p.entity === 'signOff') signCalls.add(p.data.callId as string)
      if (p.entity === 'clockEvent') clockCalls.add(p.data.callId as string)
    }
    else if (p.kind === 'update' && p.entity === 'call') callIds.add(ops[i]!.entityId)
    else if (p.kind === 'command') conflictIds.push(p.data.conflictId)
  })
  if (conflictIds.length) {
    const c = tables.conflicts
    const rows = await tx.select({ callId: c.callId }).from(c).where(inArray(c.id, conflictIds))
    for (const r of rows) callIds.add(r.callId)
  }
  // One statement, in id order, so concurrent pushes take the call locks in the same order.
  if (callIds.size) {
    const rows = await tx.select().from(tables.calls).where(inArray(tables.calls.id, [...callIds])).orderBy(tables.calls.id)
      .for('no key update')
    for (const r of rows) ctx.calls.set(r.id, r)
  }
  if (runIds.size) {
    const t = tables.testRuns
    const rows = await tx.select({ id: t.id, callId: t.callId }).from(t).where(inArray(t.id, [...runIds]))
    for (const r of rows) refs.testRuns.set(r.id, r.callId)
  }
  if (cardIds.size) {
    const v = tables.testCardVersions
    const rows = await tx.select({ cardId: v.cardId, n: v.cardVersion }).from(v).where(inArray(v.cardId, [...cardIds]))
    for (const r of rows) refs.cardVersions.add(`${r.cardId}:${r.n}`)
  }
  if (truckIds.size) {
    const t = tables.serviceTrucks
    const trucks = await tx.select({ id: t.id }).from(t).where(inArray(t.id, [...truckIds]))
    for (const r of trucks) refs.trucks.add(r.id)
    const s = tables.truckStock
    const stock = await tx
      .select({ truckId: s.truckId, partNumber: s.partNumber, unitPriceCents: s.unitPriceCents, coreChargeCents: s.coreChargeCents })
      .from(s).where(inArray(s.truckId, [...truckIds]))
    for (const r of stock) refs.stock.set(`${r.truckId}:${r.partNumber}`, r)
  }
  if (signCalls.size) {
    const t = tables.signOffs
    const rows = await tx.select({ id: t.id, callId: t.callId }).from(t).where(inArray(t.callId, [...signCalls]))
    for (const r of rows) refs.signedCalls.set(r.callId, r.id)
  }
  if (clockCalls.size) {
    const c = tables.clockEvents
    const rows = await tx.select({ id: c.id, callId: c.callId, kind: c.kind, deviceAt: c.deviceAt, createdAt: c.createdAt, flag: c.flag })
      .from(c).where(inArray(c.callId, [...clockCalls]))
    for (const r of rows) ctx.clockOf(r.callId).push({ id: r.id, kind: r.kind, at: r.deviceAt ?? r.createdAt, flag: r.flag })
  }
  return ctx
}
