// What the service trucks carry, changed only through logged moves: a line added, a count
// corrected, a transfer between trucks (parts used on a call come off by the `wayside_take_stock`
// trigger). Every move keeps who, when, before, after and why in `stock_moves`.
import { and, asc, eq, lt, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { stockCountSchema, stockLineCreateSchema, stockLinePatchSchema, stockTransferSchema } from '#shared/schemas/stock'
import type { CsvColumn } from './csv'
import type { Tx } from './db'

interface MoveRow {
  id: string
  kind: string
  partNumber: string
  delta: number
  before: number | null
  after: number | null
  shortfall: number
  reason: string | null
  at: string
  callId: string | null
  byName: string | null
  otherTruck: string | null
}

type LineCreate = z.output<typeof stockLineCreateSchema>
type LinePatch = z.output<typeof stockLinePatchSchema>
type Count = z.output<typeof stockCountSchema>
type Transfer = z.output<typeof stockTransferSchema>

/** Quantities are kept to two decimals (litres of DEF, metres of wire); float sums are rounded back. */
const q2 = (n: number) => Math.round(n * 100) / 100

async function partTaken(tx: Tx, truckId: string, partNumber: string) {
  const s = tables.truckStock
  const [row] = await tx.select({ id: s.id }).from(s).where(and(eq(s.truckId, truckId), sql`lower(${s.partNumber}) = lower(${partNumber})`))
  if (row) ruleError('partNumber', 'This truck already carries this part number; correct its count instead')
}

/** A new stock line on a truck, logged as 'added' with what it starts with; undefined when no such truck. */
export async function addStockLine(truckId: string, input: LineCreate, byUserId: string) {
  return useDb().transaction(async (tx) => {
    const t = tables.serviceTrucks
    const [truck] = await tx.select({ id: t.id }).from(t).where(eq(t.id, truckId)).for('update')
    if (!truck) return undefined
    await partTaken(tx, truckId, input.partNumber)
    const [row] = await tx.insert(tables.truckStock).values({
      truckId, partNumber: input.partNumber, description: input.description, bin: input.bin ?? null, quantity: input.onHand,
      minimum: input.minimum, costCents: input.costCents, unitPriceCents: input.unitPriceCents, coreChargeCents: input.coreChargeCents,
    }).returning()
    await tx.insert(tables.stockMoves).values({
      truckId, stockId: row!.id, partNumber: row!.partNumber, kind: 'added', delta: input.onHand, before: 0, after: input.onHand,
      reason: 'New stock line', byUserId,
    })
    return row!
  })
}

function staleVersion(current: unknown): never {
  const message = 'Someone changed this stock line meanwhile'
  throw createError({ status: 409, statusText: 'Changed meanwhile', message, data: { current } })
}

/** Description, bin, minimum and prices; undefined when there is no such line, 409 when `version` is stale. */
export async function updateStockLine(id: string, patch: LinePatch) {
  const s = tables.truckStock
  return useDb().transaction(async (tx) => {
    const [current] = await tx.select().from(s).where(eq(s.id, id)).for('update')
    if (!current) return undefined
    if (current.version !== patch.version) staleVersion(current)
    const { version: _, ...set } = patch
    const [row] = await tx.update(s).set(set).where(eq(s.id, id)).returning()
    return row!
  })
}

/** Sets on hand to what was counted, logging the difference; undefined when there is no such line. */
export async function countStock(id: string, input: Count, byUserId: string) {
  const s = tables.truckStock
  return useDb().transaction(async (tx) => {
    const [line] = await tx.select().from(s).where(eq(s.id, id)).for('update')
    if (!line) return undefined
    const [row] = await tx.update(s).set({ quantity: input.counted }).where(eq(s.id, id)).returning()
    const [move] = await tx.insert(tables.stockMoves).values({
      truckId: line.truckId, stockId: id, partNumber: line.partNumber, kind: 'count', delta: q2(input.counted - line.quantity),
      before: line.quantity, after: input.counted, reason: input.reason, byUserId,
    }).returning()
    return { line: row!, move: move! }
  })
}

/**
 * Moves parts from one truck's line to another truck, making the line there when that truck does
 * not carry the part yet (same description and prices, no bin, no minimum). Both halves share a
 * transfer id. Refused (422) beyond what the line has on hand: those parts are not on the truck.
 */
export async function transferStock(input: Transfer, byUserId: string) {
  const s = tables.truckStock
  return useDb().transaction(async (tx) => {
    const [from] = await tx.select().from(s).where(eq(s.id, input.fromStockId))
    if (!from) ruleError('fromStockId', 'No such stock line')
    if (from.truckId === input.toTruckId) ruleError('toTruckId', 'Pick another truck than the one the parts are on')
    const [truck] = await tx.select({ id: tables.serviceTrucks.id, active: tables.serviceTrucks.active }).from(tables.serviceTrucks)
      .where(eq(tables.serviceTrucks.id, input.toTruckId))
    if (!truck?.active) ruleError('toTruckId', 'Pick a truck in service')
    await tx.insert(s).values({
      truckId: input.toTruckId, partNumber: from.partNumber, description: from.description, quantity: 0, minimum: 0,
      costCents: from.costCents, unitPriceCents: from.unitPriceCents, coreChargeCents: from.coreChargeCents,
    }).onConflictDoNothing()
    // Both lines locked in id order, so two transfers the other way round cannot deadlock.
    const locked = await tx.select().from(s)
      .where(sql`${s.id} = ${from.id} OR (${s.truckId} = ${input.toTruckId} AND ${s.partNumber} = ${from.partNumber})`)
      .orderBy(asc(s.id)).for('update')
    const src = locked.find(r => r.id === from.id)!
    const dst = locked.find(r => r.id !== from.id)!
    if (input.quantity > src.quantity) ruleError('quantity', `Only ${Math.max(src.quantity, 0)} on hand on this truck`)
    const transferId = crypto.randomUUID()
    const srcAfter = q2(src.quantity - input.quantity)
    const dstAfter = q2(dst.quantity + input.quantity)
    await tx.update(s).set({ quantity: srcAfter }).where(eq(s.id, src.id))
    await tx.update(s).set({ quantity: dstAfter }).where(eq(s.id, dst.id))
    const moves = await tx.insert(tables.stockMoves).values([
      { truckId: src.truckId, stockId: src.id, partNumber: src.partNumber, kind: 'transfer_out', delta: -input.quantity,
        before: src.quantity, after: srcAfter, reason: input.reason, transferId, byUserId },
      { truckId: dst.truckId, stockId: dst.id, partNumber: dst.partNumber, kind: 'transfer_in', delta: input.quantity, before: dst.quantity,
        after: dstAfter, reason: input.reason, transferId, byUserId },
    ]).returning()
    return { transferId, moves }
  })
}

/** A truck's stock for the admin: every field, with what was used beyond the count. */
export async function stockLinesOf(truckId: string) {
  const s = tables.truckStock
  return useDb().select().from(s).where(eq(s.truckId, truckId)).orderBy(asc(s.partNumber))
}

/** The newest moves of a truck's stock, with who made them, the call and the other truck of a transfer. */
export async function stockMovesOf(truckId: string, limit = 100) {
  const m = tables.stockMoves
  const rows = await useDb().execute(sql`
    SELECT m.id, m.kind, m.part_number AS "partNumber", m.delta, m.before, m.after, m.shortfall, m.reason, m.at,
      m.call_id AS "callId", u.name AS "byName",
      (SELECT t.name FROM ${m} o JOIN service_trucks t ON t.id = o.truck_id
        WHERE o.transfer_id = m.transfer_id AND o.id <> m.id LIMIT 1) AS "otherTruck"
    FROM ${m} m LEFT JOIN users u ON u.id = m.by_user_id
    WHERE m.truck_id = ${truckId}
    ORDER BY m.at DESC, m.id
    LIMIT ${limit}`)
  return rows.rows as unknown as MoveRow[]
}

/** Lines below their minimum, by truck and bin, with how many bring each back up to it. */
export async function restockList(truckId?: string) {
  const s = tables.truckStock
  const t = tables.serviceTrucks
  const rows = await useDb().select({
    truckId: t.id, truck: t.name, partNumber: s.partNumber, description: s.description, bin: s.bin, onHand: s.quantity,
    minimum: s.minimum, costCents: s.costCents,
  }).from(s).innerJoin(t, eq(t.id, s.truckId))
    .where(and(lt(s.quantity, s.minimum), eq(t.active, true), truckId ? eq(t.id, truckId) : undefined))
    .orderBy(asc(t.name), asc(s.bin), asc(s.partNumber))
  return rows.map(r => ({ ...r, toOrder: q2(r.minimum - r.onHand) }))
}

type RestockRow = Awaited<ReturnType<typeof restockList>>[number]

/** The restock list's CSV columns (documented in the README). */
export const RESTOCK_COLUMNS: CsvColumn<RestockRow>[] = [
  { header: 'Truck', kind: 'text', value: r => r.truck },
  { header: 'Bin', kind: 'text', value: r => r.bin },
  { header: 'Part number', kind: 'text', value: r => r.partNumber },
  { header: 'Description', kind: 'text', value: r => r.description },
  { header: 'On hand', kind: 'number', value: r => r.onHand },
  { header: 'Minimum', kind: 'number', value: r => r.minimum },
  { header: 'To order', kind: 'number', value: r => r.toOrder },
  { header: 'Unit cost', kind: 'money', value: r => r.costCents },
]
