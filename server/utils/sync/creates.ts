// The creates stage: each create becomes its row and waits in a buffer per entity, written with
// one multi-row INSERT per entity (before any update, so an update sees the rows created before
// it). A create of an id that exists already is a repeat: the same content is a no-op, another
// content is refused. Clock events get the long-span flag as they are written.
import { and, inArray, isNull, type SQL } from 'drizzle-orm'
import type { Op } from '#shared/schemas/sync'
import { RECORD_ENTITY_NAMES, type RecordEntityName } from '#shared/sync/entities'
import { longSpanIds } from '#shared/sync/clockBounds'
import type { ClockKind } from '#shared/utils/clockSpans'
import { bulkInsert, bulkInsertSql } from './bulk'
import { entityWord, rejectOp, type ApplyContext, type ClockSeen, type OpOutcome } from './context'
import { sameSyncValue } from './merge'
import { buildCreateRow, type CreateRow } from './rows'
import { isDataRefusal, refusalReason } from './strategy'
import { RECORD_TABLES } from './tables'

type Pending = { index: number, row: CreateRow }
/** What one INSERT of an entity's buffer did: the first create of each id, the ids written, refused, or found there. */
type Written = {
  first: Map<string, Pending>
  inserted: Set<string>
  refused: Map<string, string>
  existing: Map<string, Record<string, unknown>>
}

// The registry's order: test runs first, since readings may point at a run created in the same push.
const WRITE_ORDER = RECORD_ENTITY_NAMES
/** Columns that are not the record's content, left out when a repeated create is compared (flag and signedAt are the server's). */
const NOT_CONTENT = new Set(['id', 'createdBy', 'deviceAt', 'flag', 'signedAt'])

/** Whether a create repeats a stored (or earlier) row: the same content, whoever sent it and when. */
export function sameRecordContent(row: Record<string, unknown>, there: Record<string, unknown>): boolean {
  return Object.keys(row).every(k => NOT_CONTENT.has(k) || sameSyncValue(row[k], there[k]))
}

export class CreateStage {
  private buffers = new Map<RecordEntityName, Pending[]>()

  constructor(private ctx: ApplyContext, private outcomes: OpOutcome[]) {}

  /** Builds the create's row and buffers it; a create that points at nothing is refused here. */
  queue(index: number, op: Op, entity: RecordEntityName, data: Record<string, unknown>) {
    const built = buildCreateRow(this.ctx, entity, op, data)
    if (typeof built === 'string') {
      this.outcomes[index] = rejectOp(built)
      return
    }
    const { refs } = this.ctx
    if (entity === 'testRun') refs.testRuns.set(built.id, built.callId)
    if (entity === 'signOff') {
      const existing = refs.signedCalls.get(built.callId)
      if (existing && existing !== built.id) {
        this.outcomes[index] = rejectOp('callId: this call already has a sign-off')
        return
      }
      refs.signedCalls.set(built.callId, built.id)
    }
    const list = this.buffers.get(entity) ?? []
    list.push({ index, row: built })
    this.buffers.set(entity, list)
  }

  /** Writes every buffered create now, comparing repeats op by op. */
  async write() {
    for (const entity of WRITE_ORDER) {
      const pending = this.take(entity)
      if (!pending) continue
      if (entity === 'clockEvent') await this.flagLongSpans(pending)
      await this.insertAll(entity, pending)
    }
  }

  /**
   * The fast pass: the creates left become plain INSERTs for the push's closing statement. Any clash
   * (an id that exists already) or refusal fails that statement, and the careful pass then compares
   * and rejects op by op.
   */
  async closingInserts(): Promise<SQL[]> {
    const out: SQL[] = []
    for (const entity of WRITE_ORDER) {
      const pending = this.take(entity)
      if (!pending) continue
      if (entity === 'clockEvent') await this.flagLongSpans(pending)
      const first = new Map<string, Pending>()
      for (const p of pending) {
        const f = first.get(p.row.id)
        if (!f) {
          first.set(p.row.id, p)
          this.outcomes[p.index] = { status: 'applied', version: 1 }
          continue
        }
        this.outcomes[p.index] = sameRecordContent(p.row, f.row)
          ? { status: 'applied', version: 1 }
          : rejectOp(`entityId: a different ${entityWord(entity)} already has this id`)
      }
      out.push(bulkInsertSql(RECORD_TABLES[entity], [...first.values()].map(p => p.row), { returning: false, skipClashes: false }))
    }
    return out
  }

  private take(entity: RecordEntityName): Pending[] | undefined {
    const pending = this.buffers.get(entity)
    this.buffers.delete(entity)
    return pending?.length ? pending : undefined
  }

  private async insertAll(entity: RecordEntityName, pending: Pending[]) {
    const { ctx } = this
    const table = RECORD_TABLES[entity]
    // A second create of the same id in one push is compared with the first, after it is written.
    const first = new Map<string, Pending>()
    for (const p of pending) if (!first.has(p.row.id)) first.set(p.row.id, p)
    const rows = [...first.values()]
    const inserted = new Set<string>()
    const refused = new Map<string, string>()
    try {
      for (const id of await ctx.guard(() => bulkInsert(ctx.tx, table, rows.map(p => p.row)))) inserted.add(id)
    }
    catch (err) {
      if (!isDataRefusal(err)) throw err
      // Something the checks did not foresee (only the careful pass gets here): find the bad rows one at a time.
      for (const p of rows) {
        try {
          for (const id of await ctx.guard(() => bulkInsert(ctx.tx, table, [p.row]))) inserted.add(id)
        }
        catch (e) {
          if (!isDataRefusal(e)) throw e
          refused.set(p.row.id, refusalReason(e, p.row))
        }
      }
    }
    const again = pending.filter(p => !inserted.has(p.row.id) && !refused.has(p.row.id))
    const existing = new Map<string, Record<string, unknown>>()
    if (again.length) {
      const rowsThere = await ctx.tx.select().from(table).where(inArray(table.id, [...new Set(again.map(p => p.row.id))]))
      for (const r of rowsThere as Record<string, unknown>[]) existing.set(r.id as string, r)
    }
    for (const p of pending) this.outcomes[p.index] = this.outcomeOf(entity, p, { first, inserted, refused, existing })
  }

  private outcomeOf(entity: RecordEntityName, p: Pending, seen: Written): OpOutcome {
    const refusal = seen.refused.get(p.row.id)
    if (refusal) return rejectOp(refusal)
    const written = seen.inserted.has(p.row.id)
    if (written && seen.first.get(p.row.id) === p) return { status: 'applied', version: 1 }
    // Already there (an earlier push, or earlier in this one): the same content is a no-op.
    const there = seen.existing.get(p.row.id) ?? (written ? seen.first.get(p.row.id)?.row : undefined)
    if (!there) {
      return rejectOp(entity === 'signOff' ? 'callId: this call already has a sign-off' : 'entityId: clashes with an existing record')
    }
    return sameRecordContent(p.row, there)
      ? { status: 'applied', version: (there.version as number | undefined) ?? 1 }
      : rejectOp(`entityId: a different ${entityWord(entity)} already has this id`)
  }

  /**
   * A span nobody works in one go (see longSpanIds), among each call's clock events with the ones
   * about to be written: those get the flag in their row, the stored end of the span an UPDATE.
   */
  private async flagLongSpans(pending: Pending[]) {
    const stored: string[] = []
    for (const callId of new Set(pending.map(p => p.row.callId))) {
      const known = this.ctx.clockOf(callId)
      const seen = new Set(known.map(e => e.id))
      const fresh: ClockSeen[] = []
      for (const p of pending) {
        if (p.row.callId !== callId || seen.has(p.row.id)) continue
        seen.add(p.row.id)
        fresh.push({ id: p.row.id, kind: p.row.kind as ClockKind, at: p.row.deviceAt as Date, flag: p.row.flag as string | null })
      }
      const long = new Set(longSpanIds([...known, ...fresh]))
      for (const e of known) {
        if (long.has(e.id) && !e.flag) {
          e.flag = 'long_span'
          stored.push(e.id)
        }
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
    await this.ctx.guard(() => this.ctx.tx.update(c).set({ flag: 'long_span' }).where(and(inArray(c.id, stored), isNull(c.flag))))
  }
}
