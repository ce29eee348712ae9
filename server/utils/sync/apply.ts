// Applies a push's fresh ops inside the push transaction. Creates are gathered per entity and
// written with one multi-row INSERT each (flushed before any update, so an update sees the rows
// created before it); updates and conflict settlements run one by one. The fast pass has no
// savepoints; if the database refuses a row, the push runs again carefully, with a savepoint
// around each insert and update, so only the refused op is rejected (see SyncApplier).
import { and, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { Op } from '#shared/schemas/sync'
import {
  checkOp, RECORD_ENTITY_NAMES, SYNC_ENTITIES, type CheckedOp, type RecordCreate, type RecordEntityName,
  type UpdatableEntityName,
} from '#shared/sync/entities'
import { clockBoundFlag, longSpanIds } from '#shared/sync/clockBounds'
import { isBilledStatus } from '#shared/utils/callStatus'
import { judge } from '#shared/utils/spec'
import type { ClockKind } from '#shared/utils/billing'
import type { Tx } from '../db'
import { callOutcomeProblem, writeCallChanges, type CallRow } from './callWrite'
import { resolveConflictInTx, SyncRuleError } from './conflicts'
import { bulkInsert, bulkInsertSql } from './bulk'
import { mergeCallField, sameSyncValue, stableSyncJson } from './merge'
import { isRetryableTxError, pgErrorCode } from './retry'
import { RECORD_TABLES } from './tables'

export type OpOutcome = { status: 'applied' | 'conflict' | 'rejected', version?: number, reason?: string }

type ChildEntity = RecordEntityName
type Parsed = CheckedOp

const rejected = (reason: string): OpOutcome => ({ status: 'rejected', reason })
const FORBIDDEN = 'forbidden'
const word = (entity: RecordEntityName) => SYNC_ENTITIES[entity].words.one

const TABLE = RECORD_TABLES
// The registry's order: test runs first, since readings may point at a run created in the same push.
const FLUSH_ORDER = RECORD_ENTITY_NAMES
/** Columns that are not the record's content, left out when a repeated create is compared (the flag is the server's). */
const NOT_CONTENT = new Set(['id', 'createdBy', 'deviceAt', 'flag'])

const toDate = (v: unknown) => (typeof v === 'string' ? new Date(v) : null)

type Row = Record<string, unknown> & { id: string, callId: string }
type Pending = { index: number, row: Row }
/** A clock event as the bounds judge it: its device time, and the server's flag once it has one. */
type ClockSeen = { id: string, kind: ClockKind, at: Date, flag: string | null }
type ConflictInsert = typeof tables.conflicts.$inferInsert

/** What the push already knows about rows its ops point at, fetched in a few queries up front. */
interface Refs {
  testRuns: Map<string, string> // id → callId (in the database or created earlier in this push)
  cardVersions: Set<string> // `${cardId}:${version}`
  trucks: Set<string>
  stock: Map<string, { unitPriceCents: number, coreChargeCents: number }> // `${truckId}:${partNumber}`
  signedCalls: Map<string, string> // callId → sign-off id
  clock: Map<string, ClockSeen[]> // callId → its clock events (stored, and queued in this push)
}

function isDataError(err: unknown) {
  const code = pgErrorCode(err)
  return !!code && (code.startsWith('22') || code.startsWith('23'))
}
/** Why the database refused a row, naming the field where it can tell. */
function dbReason(err: unknown, values: Record<string, unknown>) {
  const cause = ((err as { cause?: unknown }).cause ?? err) as { message?: string, column?: string, constraint?: string }
  // A NUL deep inside a JSON value is the one refusal the schemas cannot see; find its field.
  const nul = Object.keys(values).find(k => stableSyncJson(values[k]).includes('\\u0000'))
  const what = cause.column ?? nul ?? cause.constraint ?? 'record'
  return `${what}: the database refused it (${cause.message ?? 'invalid'})`
}

export class SyncApplier {
  readonly results: OpOutcome[]
  private parsed: Parsed[]
  private calls = new Map<string, CallRow>()
  private refs: Refs = {
    testRuns: new Map(), cardVersions: new Set(), trucks: new Set(), stock: new Map(), signedCalls: new Map(), clock: new Map(),
  }

  /** The server's now for this push: the upper bound of a phone's clock. */
  private now = new Date()
  private buffers = new Map<ChildEntity, Pending[]>()
  /** Creates for invoiced or paid calls: kept as conflicts, never added to the record. */
  private billed: { index: number, op: Op, entity: ChildEntity, data: Record<string, unknown> }[] = []
  private sp = 0
  /** Fast pass only: inserts left for the push's closing statement. */
  deferred: SQL[] = []

  /**
   * careful = false: no savepoints, the fast path; a row the database refuses aborts the push,
   * which then runs again with careful = true, where savepoints find the bad op and reject only it.
   */
  constructor(private tx: Tx, private user: User, private ops: Op[], private limits: { photoMaxBytes: number }, private careful = false) {
    this.results = ops.map(() => ({ status: 'rejected' }))
    this.parsed = ops.map(checkOp)
  }

  async run(): Promise<OpOutcome[]> {
    await this.load()
    for (let i = 0; i < this.ops.length; i++) {
      const p = this.parsed[i]!
      const op = this.ops[i]!
      if (!p.ok) this.results[i] = rejected(p.reason)
      else if (p.kind === 'create') this.queueCreate(i, op, p.entity, p.data)
      else {
        await this.flush()
        this.results[i] = await this.inSavepoint(op.changes, () =>
          p.kind === 'command'
            ? this.resolution(p.data, p.hasValue)
            : p.entity === 'call'
              ? this.callUpdate(op, p.data)
              : this.childUpdate(op, p.entity, p.data))
      }
    }
    await this.keepBilled()
    if (this.careful) await this.flush()
    else this.deferred = await this.deferFlush()
    return this.results
  }

  /**
   * Fast pass: the creates left at the end become plain INSERTs the push sends together with
   * its stored results, in one statement. Any clash (an id that exists already) or refusal fails
   * that statement, and the careful pass then compares and rejects op by op.
   */
  private async deferFlush(): Promise<SQL[]> {
    const out: SQL[] = []
    for (const entity of FLUSH_ORDER) {
      const pending = this.buffers.get(entity)
      if (!pending?.length) continue
      this.buffers.delete(entity)
      if (entity === 'clockEvent') await this.flagLongSpans(pending)
      const first = new Map<string, Pending>()
      for (const p of pending) {
        const f = first.get(p.row.id)
        if (!f) { first.set(p.row.id, p); this.results[p.index] = { status: 'applied', version: 1 }; continue }
        const same = Object.keys(p.row).every(k => NOT_CONTENT.has(k) || sameSyncValue(p.row[k], f.row[k]))
        this.results[p.index] = same ? { status: 'applied', version: 1 } : rejected(`entityId: a different ${word(entity)} already has this id`)
      }
      out.push(bulkInsertSql(TABLE[entity], [...first.values()].map(p => p.row), { returning: false, skipClashes: false }))
    }
    return out
  }

  // ── Loading ─────────────────────────────────────────────────────────────────────────────
  private async load() {
    const { tx } = this
    const callIds = new Set<string>()
    const runIds = new Set<string>(), cardIds = new Set<string>(), truckIds = new Set<string>(), signCalls = new Set<string>()
    const clockCalls = new Set<string>()
    const conflictIds: string[] = []
    this.parsed.forEach((p, i) => {
      if (!p.ok) return
      if (p.kind === 'create') {
        callIds.add(p.data.callId as string)
        if (p.entity === 'reading' && p.data.testRunId) runIds.add(p.data.testRunId as string)
        if (p.entity === 'testRun') cardIds.add(p.data.cardId as string)
        if (p.entity === 'partLine' && p.data.serviceTruckId) truckIds.add(p.data.serviceTruckId as string)
        if (p.entity === 'signOff') signCalls.add(p.data.callId as string)
        if (p.entity === 'clockEvent') clockCalls.add(p.data.callId as string)
      }
      else if (p.kind === 'update' && p.entity === 'call') callIds.add(this.ops[i]!.entityId)
      else if (p.kind === 'command') conflictIds.push(p.data.conflictId)
    })
    if (conflictIds.length) {
      const rows = await tx.select({ callId: tables.conflicts.callId }).from(tables.conflicts).where(inArray(tables.conflicts.id, conflictIds))
      for (const r of rows) callIds.add(r.callId)
    }
    // One statement, in id order, so concurrent pushes take the call locks in the same order.
    if (callIds.size) {
      const rows = await tx.select().from(tables.calls).where(inArray(tables.calls.id, [...callIds])).orderBy(tables.calls.id).for('no key update')
      for (const r of rows) this.calls.set(r.id, r)
    }
    const jobs: Promise<void>[] = []
    if (runIds.size) {
      jobs.push(tx.select({ id: tables.testRuns.id, callId: tables.testRuns.callId }).from(tables.testRuns).where(inArray(tables.testRuns.id, [...runIds]))
        .then((rows) => { for (const r of rows) this.refs.testRuns.set(r.id, r.callId) }))
    }
    if (cardIds.size) {
      jobs.push(tx.select({ cardId: tables.testCardVersions.cardId, v: tables.testCardVersions.cardVersion }).from(tables.testCardVersions)
        .where(inArray(tables.testCardVersions.cardId, [...cardIds]))
        .then((rows) => { for (const r of rows) this.refs.cardVersions.add(`${r.cardId}:${r.v}`) }))
    }
    if (truckIds.size) {
      jobs.push(tx.select({ id: tables.serviceTrucks.id }).from(tables.serviceTrucks).where(inArray(tables.serviceTrucks.id, [...truckIds]))
        .then((rows) => { for (const r of rows) this.refs.trucks.add(r.id) }))
      const s = tables.truckStock
      jobs.push(tx.select({ truckId: s.truckId, partNumber: s.partNumber, unitPriceCents: s.unitPriceCents, coreChargeCents: s.coreChargeCents })
        .from(s).where(inArray(s.truckId, [...truckIds]))
        .then((rows) => { for (const r of rows) this.refs.stock.set(`${r.truckId}:${r.partNumber}`, r) }))
    }
    if (signCalls.size) {
      jobs.push(tx.select({ id: tables.signOffs.id, callId: tables.signOffs.callId }).from(tables.signOffs).where(inArray(tables.signOffs.callId, [...signCalls]))
        .then((rows) => { for (const r of rows) this.refs.signedCalls.set(r.callId, r.id) }))
    }
    if (clockCalls.size) {
      const c = tables.clockEvents
      jobs.push(tx.select({ id: c.id, callId: c.callId, kind: c.kind, deviceAt: c.deviceAt, createdAt: c.createdAt, flag: c.flag })
        .from(c).where(inArray(c.callId, [...clockCalls]))
        .then((rows) => {
          for (const r of rows) this.clockOf(r.callId).push({ id: r.id, kind: r.kind, at: r.deviceAt ?? r.createdAt, flag: r.flag })
        }))
    }
    // Sequential on the one connection anyway; Promise.all just keeps the code flat.
    await Promise.all(jobs)
  }

  private clockOf(callId: string): ClockSeen[] {
    let list = this.refs.clock.get(callId)
    if (!list) this.refs.clock.set(callId, list = [])
    return list
  }

  /** The call of a record an op changes in place; read, not locked (the record's row is). */
  private async callOf(id: string): Promise<CallRow | undefined> {
    const known = this.calls.get(id)
    if (known) return known
    const [row] = await this.tx.select().from(tables.calls).where(eq(tables.calls.id, id))
    return row
  }

  /** A reason to refuse the user this call, or undefined when they may write to it. */
  private accessProblem(call: CallRow | undefined): string | undefined {
    if (this.user.role === 'mechanic') return call && call.mechanicId === this.user.id ? undefined : FORBIDDEN
    return call ? undefined : 'callId: no such call'
  }

  // ── Creates ─────────────────────────────────────────────────────────────────────────────
  private queueCreate(index: number, op: Op, entity: ChildEntity, data: Record<string, unknown>) {
    const call = this.calls.get(data.callId as string)
    const problem = this.accessProblem(call)
    if (problem) { this.results[index] = rejected(problem); return }
    if (isBilledStatus(call!.status)) { this.billed.push({ index, op, entity, data }); return }
    const built = this.buildRow(entity, op, data)
    if (typeof built === 'string') { this.results[index] = rejected(built); return }
    if (entity === 'testRun') this.refs.testRuns.set(built.id, built.callId)
    if (entity === 'signOff') {
      const existing = this.refs.signedCalls.get(built.callId)
      if (existing && existing !== built.id) { this.results[index] = rejected('callId: this call already has a sign-off'); return }
      this.refs.signedCalls.set(built.callId, built.id)
    }
    const list = this.buffers.get(entity) ?? []
    list.push({ index, row: built })
    this.buffers.set(entity, list)
  }

  /**
   * The full row for a create (every column set, so a repeated create compares completely).
   * Written out field by field: object spread in this hot path costs more than the insert.
   */
  private buildRow(entity: ChildEntity, op: Op, data: Record<string, unknown>): Row | string {
    const id = op.entityId
    const callId = data.callId as string
    const createdBy = this.user.id
    const deviceAt = new Date(op.at)
    switch (entity) {
      case 'reading': {
        const d = data as RecordCreate<'reading'>
        if (d.testRunId && this.refs.testRuns.get(d.testRunId) !== d.callId) return 'testRunId: no such test run on this call'
        let verdict = d.verdict ?? null
        // The server judges again when the spec is one it can read; the device's verdict is a hint.
        if (d.spec) {
          try { verdict = judge(d.value, d.spec) }
          catch { /* a spec the judge cannot read leaves the device's verdict */ }
        }
        return {
          id, callId, createdBy, deviceAt, testRunId: d.testRunId ?? null, stepId: d.stepId ?? null, label: d.label,
          quantity: d.quantity, value: d.value, unit: d.unit, component: d.component ?? null, pins: d.pins ?? null,
          conditions: d.conditions ?? null, partRole: d.partRole ?? null, spec: d.spec ?? null, verdict,
        }
      }
      case 'faultCode': {
        const d = data as RecordCreate<'faultCode'>
        return {
          id, callId, createdBy, deviceAt, code: d.code ?? null, spn: d.spn ?? null, fmi: d.fmi ?? null, state: d.state ?? 'active',
          count: d.count ?? 1, source: d.source ?? null, clearedAt: toDate(d.clearedAt), note: d.note ?? null,
        }
      }
      case 'note': return { id, callId, createdBy, deviceAt, text: (data as RecordCreate<'note'>).text }
      case 'clockEvent': {
        // The phone's time is kept (labor is priced from it); the server flags it when out of bounds.
        const flag = clockBoundFlag(deviceAt, { takenAt: this.calls.get(callId)!.receivedAt, now: this.now })
        return { id, callId, createdBy, deviceAt, kind: (data as RecordCreate<'clockEvent'>).kind, flag }
      }
      case 'photo': {
        const d = data as RecordCreate<'photo'>
        if (d.sizeBytes > this.limits.photoMaxBytes) return `sizeBytes: larger than the ${this.limits.photoMaxBytes}-byte photo limit`
        return { id, callId, createdBy, deviceAt, sha256: d.sha256, contentType: d.contentType, sizeBytes: d.sizeBytes, caption: d.caption ?? null }
      }
      case 'partLine': {
        const d = data as RecordCreate<'partLine'>
        if (d.serviceTruckId && !this.refs.trucks.has(d.serviceTruckId)) return 'serviceTruckId: no such service truck'
        const stock = d.serviceTruckId ? this.refs.stock.get(`${d.serviceTruckId}:${d.partNumber}`) : undefined
        return {
          id, callId, createdBy, deviceAt, partNumber: d.partNumber, description: d.description, quantity: d.quantity,
          unitPriceCents: d.unitPriceCents ?? stock?.unitPriceCents ?? 0, coreChargeCents: d.coreChargeCents ?? stock?.coreChargeCents ?? 0,
          serviceTruckId: d.serviceTruckId ?? null,
        }
      }
      case 'testRun': {
        const d = data as RecordCreate<'testRun'>
        if (!this.refs.cardVersions.has(`${d.cardId}:${d.cardVersion}`)) return 'cardVersion: no such version of this test card'
        return {
          id, callId, createdBy, deviceAt, cardId: d.cardId, cardVersion: d.cardVersion, ambientC: d.ambientC ?? null, steps: d.steps,
          conclusion: d.conclusion ?? null, finishedAt: toDate(d.finishedAt),
        }
      }
      case 'signOff': {
        const d = data as RecordCreate<'signOff'>
        return { id, callId, createdBy, deviceAt, driverName: d.driverName, signature: d.signature }
      }
    }
  }

  private async flush() {
    for (const entity of FLUSH_ORDER) {
      const pending = this.buffers.get(entity)
      if (!pending?.length) continue
      this.buffers.delete(entity)
      if (entity === 'clockEvent') await this.flagLongSpans(pending)
      await this.insertAll(entity, pending)
    }
  }

  private async insertAll(entity: ChildEntity, pending: Pending[]) {
    const table = TABLE[entity]
    // A second create of the same id in one push is compared with the first, after it is written.
    const first = new Map<string, Pending>()
    for (const p of pending) if (!first.has(p.row.id)) first.set(p.row.id, p)
    const rows = [...first.values()]
    const inserted = new Map<string, number>()
    const refused = new Map<string, string>()
    try {
      const out = await this.inSavepointRaw(() => bulkInsert(this.tx, table, rows.map(p => p.row)))
      for (const id of out) inserted.set(id, 1)
    }
    catch (err) {
      if (!isDataError(err)) throw err
      // Something the checks above did not foresee: find the bad rows one at a time.
      for (const p of rows) {
        try {
          const out = await this.inSavepointRaw(() => bulkInsert(this.tx, table, [p.row]))
          for (const id of out) inserted.set(id, 1)
        }
        catch (e) {
          if (!isDataError(e)) throw e
          refused.set(p.row.id, dbReason(e, p.row))
        }
      }
    }
    const again = pending.filter(p => !inserted.has(p.row.id) && !refused.has(p.row.id))
    const existing = new Map<string, Record<string, unknown>>()
    if (again.length) {
      const rowsThere = await this.tx.select().from(table).where(inArray(table.id, [...new Set(again.map(p => p.row.id))]))
      for (const r of rowsThere as Record<string, unknown>[]) existing.set(r.id as string, r)
    }
    for (const p of pending) {
      const refusal = refused.get(p.row.id)
      if (refusal) { this.results[p.index] = rejected(refusal); continue }
      const version = inserted.get(p.row.id)
      if (version !== undefined && first.get(p.row.id) === p) { this.results[p.index] = { status: 'applied', version }; continue }
      // Already there (an earlier push, or earlier in this one): the same content is a no-op.
      const there = existing.get(p.row.id) ?? (version !== undefined ? first.get(p.row.id)?.row : undefined)
      if (!there) { this.results[p.index] = rejected(entity === 'signOff' ? 'callId: this call already has a sign-off' : 'entityId: clashes with an existing record'); continue }
      const same = Object.keys(p.row).every(k => NOT_CONTENT.has(k) || sameSyncValue(p.row[k], there[k]))
      this.results[p.index] = same
        ? { status: 'applied', version: (there.version as number | undefined) ?? version ?? 1 }
        : rejected(`entityId: a different ${word(entity)} already has this id`)
    }
  }

  // ── Clock bounds ────────────────────────────────────────────────────────────────────────
  /**
   * A span nobody works in one go (see longSpanIds), among each call's clock events with the ones
   * about to be written: those get the flag in their row, the stored end of the span an UPDATE.
   */
  private async flagLongSpans(pending: Pending[]) {
    const stored: string[] = []
    for (const callId of new Set(pending.map(p => p.row.callId))) {
      const known = this.clockOf(callId)
      const seen = new Set(known.map(e => e.id))
      const fresh: ClockSeen[] = []
      for (const p of pending) {
        if (p.row.callId !== callId || seen.has(p.row.id)) continue
        seen.add(p.row.id)
        fresh.push({ id: p.row.id, kind: p.row.kind as ClockKind, at: p.row.deviceAt as Date, flag: p.row.flag as string | null })
      }
      const long = new Set(longSpanIds([...known, ...fresh]))
      for (const e of known) {
        if (long.has(e.id) && !e.flag) { e.flag = 'long_span'; stored.push(e.id) }
      }
      for (const e of fresh) if (long.has(e.id) && !e.flag) e.flag = 'long_span'
      for (const p of pending) {
        const e = fresh.find(f => f.id === p.row.id)
        if (e) p.row.flag = e.flag
      }
      known.push(...fresh)
    }
    if (!stored.length) return
    const c = tables.clockEvents
    await this.inSavepointRaw(() => this.tx.update(c).set({ flag: 'long_span' }).where(and(inArray(c.id, stored), isNull(c.flag))))
  }

  // ── Creates for billed calls ────────────────────────────────────────────────────────────
  /**
   * New work for an invoiced or paid call is kept as a conflict for the office (a credit note or a
   * follow-up call), never added to the record the invoice was priced from. Sent again, the same
   * record is the same conflict; a record stored before the call was billed is a plain repeat.
   */
  private async keepBilled() {
    for (const { index, op, entity, data } of this.billed) {
      this.results[index] = await this.inSavepoint(op.changes, () => this.billedCreate(op, entity, data))
    }
  }

  private async billedCreate(op: Op, entity: ChildEntity, data: Record<string, unknown>): Promise<OpOutcome> {
    const call = this.calls.get(data.callId as string)!
    const table = TABLE[entity]
    const [there] = await this.tx.select({ id: table.id }).from(table).where(eq(table.id, op.entityId))
    if (there) return this.repeatOfStored(entity, op, data)
    const what = `the ${word(entity)} is kept for the office to add to a credit note or a follow-up call`
    const reason = billedReason('callId', call.status, what)
    const { conflicts } = tables
    const [kept] = await this.tx.select({ id: conflicts.id }).from(conflicts)
      .where(and(eq(conflicts.entity, entity), eq(conflicts.entityId, op.entityId), eq(conflicts.field, 'callId')))
    if (!kept) {
      await this.raise([{
        callId: call.id, entity, entityId: op.entityId, field: 'callId', reason, opId: op.opId, raisedBy: this.user.id,
        deviceValue: jsonb(data), serverValue: jsonb(null),
      }])
    }
    return { status: 'conflict', reason }
  }

  /** A create whose record is stored already (made before the call was billed): the same content is a no-op. */
  private async repeatOfStored(entity: ChildEntity, op: Op, data: Record<string, unknown>): Promise<OpOutcome> {
    const built = this.buildRow(entity, op, data)
    if (typeof built === 'string') return rejected(built)
    const table = TABLE[entity]
    const [row] = await this.tx.select().from(table).where(eq(table.id, op.entityId)) as Record<string, unknown>[]
    const same = Object.keys(built).every(k => NOT_CONTENT.has(k) || sameSyncValue(built[k], row![k]))
    if (!same) return rejected(`entityId: a different ${word(entity)} already has this id`)
    return { status: 'applied', version: (row!.version as number) ?? 1 }
  }

  private async raise(rows: ConflictInsert[]) {
    await this.tx.insert(tables.conflicts).values(rows)
  }

  // ── Updates ─────────────────────────────────────────────────────────────────────────────
  private async callUpdate(op: Op, changes: Record<string, unknown>): Promise<OpOutcome> {
    const call = this.calls.get(op.entityId)
    const problem = this.accessProblem(call)
    if (problem || !call) return rejected(problem === 'callId: no such call' ? 'entityId: no such call' : FORBIDDEN)
    const base = op.base ?? {}
    const takes: Record<string, unknown> = {}
    const rejects: string[] = [], notes: string[] = []
    const conflicts: (typeof tables.conflicts.$inferInsert)[] = []
    for (const [field, device] of Object.entries(changes)) {
      const server = call[field as keyof CallRow]
      const d = mergeCallField({
        field, device, server, role: this.user.role, serverStatus: call.status,
        base: field in base ? { value: base[field] } : undefined,
        baseVersionMatches: op.baseVersion !== undefined && op.baseVersion === call.version,
      })
      if (d.action === 'take') takes[field] = d.value
      else if (d.action === 'reject') rejects.push(d.reason)
      else if (d.action === 'keep') notes.push(d.reason)
      else if (d.action === 'conflict') {
        notes.push(d.reason)
        conflicts.push({
          callId: call.id, entity: 'call', entityId: call.id, field, reason: d.reason, opId: op.opId, raisedBy: this.user.id,
          baseValue: jsonb(field in base ? base[field] : null), deviceValue: jsonb(device), serverValue: jsonb(server),
        })
      }
    }
    if (rejects.length) return rejected(rejects.join('; '))
    const problemOutcome = callOutcomeProblem(call, takes)
    if (problemOutcome) {
      // The device completed the call but its status move did not take: the outcome waits with it.
      if (!('outcome' in takes) || !('status' in changes) || takes.status !== undefined) return rejected(problemOutcome)
      const reason = 'outcome: the call was not completed on the server'
      notes.push(reason)
      conflicts.push({
        callId: call.id, entity: 'call', entityId: call.id, field: 'outcome', reason, opId: op.opId, raisedBy: this.user.id,
        baseValue: jsonb('outcome' in base ? base.outcome : null), deviceValue: jsonb(takes.outcome), serverValue: jsonb(call.outcome),
      })
      delete takes.outcome
    }
    let after = call
    if (Object.keys(takes).length) after = await writeCallChanges(this.tx, call, takes, this.user, { deviceAt: new Date(op.at) })
    if (conflicts.length) await this.tx.insert(tables.conflicts).values(conflicts)
    this.calls.set(after.id, after)
    const reason = notes.length ? notes.join('; ') : undefined
    return { status: conflicts.length ? 'conflict' : 'applied', version: after.version, ...(reason ? { reason } : {}) }
  }

  /** Fault codes and test runs change in place; only their call's writers reach them. */
  private async childUpdate(op: Op, entity: Exclude<UpdatableEntityName, 'call'>, changes: Record<string, unknown>): Promise<OpOutcome> {
    const table = TABLE[entity]
    const [row] = await this.tx.select().from(table).where(eq(table.id, op.entityId)).for('update') as Record<string, unknown>[]
    if (!row) return rejected(`entityId: no such ${word(entity)}`)
    const call = await this.callOf(row.callId as string)
    const problem = this.accessProblem(call)
    if (problem) return rejected(problem === FORBIDDEN ? FORBIDDEN : 'entityId: no such call')
    if (isBilledStatus(call!.status)) return this.billedUpdate(op, entity, call!, row, changes)
    const set: Record<string, unknown> = { ...changes }
    for (const k of ['clearedAt', 'finishedAt']) if (k in set) set[k] = toDate(set[k])
    const [out] = await this.tx.update(table).set(set as any).where(eq(table.id, op.entityId)).returning({ version: table.version })
    return { status: 'applied', version: (out as { version: number }).version }
  }

  /** A change to a record of an invoiced or paid call: each field kept as a conflict, the record unchanged. */
  private async billedUpdate(
    op: Op, entity: ChildEntity, call: CallRow, row: Record<string, unknown>, changes: Record<string, unknown>,
  ): Promise<OpOutcome> {
    const fields = Object.keys(changes).filter(f => !sameSyncValue(changes[f], row[f]))
    if (!fields.length) return { status: 'applied', version: row.version as number }
    const base = op.base ?? {}
    const reasons = fields.map(f => billedReason(f, call.status, 'kept for the office'))
    await this.raise(fields.map((field, i) => ({
      callId: call.id, entity, entityId: op.entityId, field, reason: reasons[i]!, opId: op.opId, raisedBy: this.user.id,
      baseValue: jsonb(field in base ? base[field] : null), deviceValue: jsonb(changes[field]), serverValue: jsonb(row[field]),
    })))
    return { status: 'conflict', version: row.version as number, reason: reasons.join('; ') }
  }

  private async resolution(data: Extract<CheckedOp, { kind: 'command' }>['data'], hasValue: boolean): Promise<OpOutcome> {
    try {
      const { conflict, call } = await resolveConflictInTx(this.tx, this.user, data.conflictId, data.choice, data.value, { hasValue })
      this.calls.set(call.id, call)
      return { status: 'applied', version: conflict.version }
    }
    catch (err) {
      if (err instanceof SyncRuleError) return rejected(err.message)
      throw err
    }
  }

  // ── Savepoints ──────────────────────────────────────────────────────────────────────────
  private async inSavepointRaw<T>(fn: () => Promise<T>): Promise<T> {
    if (!this.careful) {
      try { return await fn() }
      catch (err) { throw isDataError(err) ? new SyncCarefulPass(err) : err }
    }
    const name = sql.raw(`sync_sp_${++this.sp}`)
    await this.tx.execute(sql`SAVEPOINT ${name}`)
    try {
      const out = await fn()
      await this.tx.execute(sql`RELEASE SAVEPOINT ${name}`)
      return out
    }
    catch (err) {
      // A failed statement aborts the transaction until we roll back to the savepoint.
      if (!isRetryableTxError(err)) await this.tx.execute(sql`ROLLBACK TO SAVEPOINT ${name}`)
      throw err
    }
  }

  /** One op in a savepoint: a row the database refuses rejects that op and keeps the rest. */
  private async inSavepoint(values: Record<string, unknown>, fn: () => Promise<OpOutcome>): Promise<OpOutcome> {
    const before = new Map(this.calls)
    try {
      return await this.inSavepointRaw(fn)
    }
    catch (err) {
      if (!this.careful || !isDataError(err)) throw err
      this.calls = before
      return rejected(dbReason(err, values))
    }
  }
}

/** The fast pass hit a row the database refused: run the push again, carefully. */
export class SyncCarefulPass extends Error {
  constructor(readonly refusal: unknown) {
    super('a row was refused; the push runs again op by op')
  }
}

/** Why new work waits for the office: an invoice was priced from the call's record. */
function billedReason(field: string, status: string, what: string) {
  return `${field}: the call is ${status}; ${what}`
}

/** A value for a jsonb column that keeps JSON null and strings as JSON. */
function jsonb(v: unknown) {
  return sql`${JSON.stringify(v ?? null)}::jsonb`
}

/** Applies the ops; in the fast pass some inserts come back in `deferred` for the caller to run. */
export async function applySyncOps(tx: Tx, user: User, ops: Op[], limits: { photoMaxBytes: number }, careful = false) {
  const applier = new SyncApplier(tx, user, ops, limits, careful)
  const outcomes = await applier.run()
  return { outcomes, deferred: applier.deferred }
}

export function isSyncDataError(err: unknown) {
  return isDataError(err)
}
