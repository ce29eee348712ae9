// Dispatch writes: take a call, edit its dispatch fields, assign or reassign, cancel. Each runs in
// one transaction that also appends the timeline row (call_events) and queues the mechanic's e-mail
// (server/utils/dispatchMail.ts), so the move and its notice commit together.
import { and, asc, eq, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { User } from '#auth-utils'
import type { callAssignSchema, callCancelSchema, callCreateSchema, callPatchSchema } from '#shared/schemas/calls'
import { CALL_EDIT_FIELDS } from '#shared/schemas/calls'
import { moveCallStatus, openCall } from './callMove'
import type { Tx } from './db'

type CallRow = typeof tables.calls.$inferSelect

async function activeMechanic(tx: Tx, mechanicId: string, field = 'mechanicId') {
  const m = await tx.query.users.findFirst({ where: eq(tables.users.id, mechanicId) })
  if (!m || m.role !== 'mechanic' || !m.active) ruleError(field, 'No active mechanic has this id')
  return m
}

async function usableTruck(tx: Tx, truckId: string, field = 'serviceTruckId') {
  const t = await tx.query.serviceTrucks.findFirst({ where: eq(tables.serviceTrucks.id, truckId) })
  if (!t || !t.active) ruleError(field, 'No service truck in use has this id')
  return t
}

/** Sets mechanic and truck, moves the call to assigned and records it; inside the caller's transaction. */
async function assignInTx(tx: Tx, call: CallRow, input: z.output<typeof callAssignSchema>, user: User) {
  // A call may be (re)assigned until its work is finished.
  if (!isOpenStatus(call.status)) {
    ruleError('mechanicId', `A call that is ${STATUS_LABELS[call.status].toLowerCase()} cannot be assigned`)
  }
  const mechanic = await activeMechanic(tx, input.mechanicId)
  const truckId = input.serviceTruckId ?? mechanic.homeTruckId ?? null
  if (truckId) await usableTruck(tx, truckId)
  const previous = call.mechanicId && call.mechanicId !== mechanic.id
    ? await tx.query.users.findFirst({ where: eq(tables.users.id, call.mechanicId), columns: { name: true } })
    : null
  const row = await moveCallStatus(tx, call, {
    to: 'assigned', kind: 'assigned', by: user.id, mechanicId: mechanic.id, also: { mechanicId: mechanic.id, serviceTruckId: truckId },
    note: previous ? `Reassigned from ${previous.name}` : call.mechanicId === mechanic.id ? 'Assigned again to the same mechanic' : null,
  })
  const mail = await queueAssignmentMail(tx, call.id, user)
  return { call: row!, mechanic, mail }
}

export async function createCall(input: z.output<typeof callCreateSchema>, user: User) {
  const { customerId: pickedCustomer, newCustomer, unitId: pickedUnit, newUnit, mechanicId, serviceTruckId, ...fields } = input
  return useDb().transaction(async (tx) => {
    let customerId = pickedCustomer
    if (newCustomer) customerId = (await createCustomer(tx, newCustomer)).id
    else if (!customerId || !(await tx.query.customers.findFirst({ where: eq(tables.customers.id, customerId), columns: { id: true } }))) {
      ruleError('customerId', 'No such customer: pick one from the list or add a new one')
    }
    let unitId = pickedUnit ?? null
    if (newUnit) unitId = (await createUnit(tx, customerId!, newUnit, 'newUnit.unitNumber')).id
    else if (unitId && !(await unitBelongsTo(tx, unitId, customerId!))) ruleError('unitId', 'This unit is not one of the customer\'s')
    // Checked before the insert, so a bad pick fails before anything is written.
    if (mechanicId) await activeMechanic(tx, mechanicId)
    if (serviceTruckId) await usableTruck(tx, serviceTruckId)

    const call = await openCall(tx, { ...fields, customerId: customerId!, unitId }, user.id)
    if (!mechanicId) return { call, mechanic: null, mail: null }
    return assignInTx(tx, call, { mechanicId, serviceTruckId }, user)
  })
}

async function lockCall(tx: Tx, id: string) {
  const [row] = await tx.select().from(tables.calls).where(eq(tables.calls.id, id)).for('update')
  return row ?? null
}

export async function assignCall(id: string, input: z.output<typeof callAssignSchema>, user: User) {
  return useDb().transaction(async (tx) => {
    const call = await lockCall(tx, id)
    if (!call) return null
    return assignInTx(tx, call, input, user)
  })
}

const FIELD_WORDS: Record<(typeof CALL_EDIT_FIELDS)[number], string> = {
  customerId: 'customer', unitId: 'unit', locationText: 'location', lat: 'latitude', lon: 'longitude', complaint: 'complaint',
  lamps: 'lamps', derate: 'derate state', derateNote: 'derate note', loaded: 'loaded', hazmat: 'hazmat', safetyNotes: 'safety notes',
  callerName: 'caller', callerPhone: 'caller phone', poNumber: 'PO number', authLimitCents: 'authorization limit',
}

/**
 * Optimistic edit of the dispatch fields: the update only lands on the version the editor read.
 * Returns 'stale' when someone else saved first (the route answers 409 with the record as it is).
 */
export async function updateCall(id: string, patch: z.output<typeof callPatchSchema>, user: User) {
  const { version, ...changes } = patch
  return useDb().transaction(async (tx) => {
    const call = await lockCall(tx, id)
    if (!call) return null
    if (call.version !== version) return 'stale' as const
    if (call.status === 'cancelled') ruleError('status', 'A cancelled call takes no more changes')
    if (isLockedStatus(call.status)) ruleError('status', 'A billed call takes no more changes')
    const customerId = changes.customerId ?? call.customerId
    if (changes.customerId && changes.customerId !== call.customerId) {
      if (!(await tx.query.customers.findFirst({ where: eq(tables.customers.id, changes.customerId),
        columns: { id: true } }))) ruleError('customerId', 'No such customer')
    }
    const unitId = changes.unitId === undefined ? call.unitId : changes.unitId
    if (unitId && !(await unitBelongsTo(tx, unitId, customerId))) ruleError('unitId', 'This unit is not one of the customer\'s')
    const differs = (f: (typeof CALL_EDIT_FIELDS)[number]) => JSON.stringify(changes[f as keyof typeof changes]) !== JSON.stringify(call[f])
    const changed = CALL_EDIT_FIELDS.filter(f => f in changes && differs(f))
    if (!changed.length) return call
    const [row] = await tx.update(tables.calls).set(changes).where(and(eq(tables.calls.id, id), eq(tables.calls.version,
      version))).returning()
    if (!row) return 'stale' as const
    await tx.insert(tables.callEvents).values({ callId: id, kind: 'edited', byUserId: user.id,
      note: `Changed ${changed.map(f => FIELD_WORDS[f]).join(', ')}` })
    return row
  })
}

export async function cancelCall(id: string, input: z.output<typeof callCancelSchema>, user: User) {
  return useDb().transaction(async (tx) => {
    const call = await lockCall(tx, id)
    if (!call) return null
    if (input.version !== undefined && input.version !== call.version) return 'stale' as const
    if (!canMoveStatus(call.status, 'cancelled') || call.status === 'cancelled') {
      ruleError('reason', `A call that is ${STATUS_LABELS[call.status].toLowerCase()} cannot be cancelled`)
    }
    const row = await moveCallStatus(tx, call, {
      to: 'cancelled', by: user.id, mechanicId: call.mechanicId, note: input.reason, also: { cancelReason: input.reason },
    })
    if (call.mechanicId) await queueCancellationMail(tx, id, user)
    return row!
  })
}

/** Mechanics for a call, ranked (shared/utils/mechanicRank.ts), with distance and a rough drive time. */
export async function suggestionsFor(call: CallRow) {
  const db = useDb()
  const { users, serviceTrucks } = tables
  // Named outright: drizzle may leave columns unqualified, which would bind them to the subquery's table.
  const working = sql.join(WORKING_STATUSES.map(s => sql`${s}`), sql`, `)
  const load = sql<number>`(SELECT count(*)::int FROM calls mc
    WHERE mc.mechanic_id = "users"."id" AND mc.status IN (${working}) AND mc.id <> ${call.id})`
  const rows = await db.select({
    id: users.id, name: users.name, phone: users.phone, onDuty: users.onDuty, lastLat: users.lastLat, lastLon: users.lastLon,
    lastPositionAt: users.lastPositionAt, openCalls: load, homeTruck: { id: serviceTrucks.id, name: serviceTrucks.name },
  }).from(users).leftJoin(serviceTrucks, eq(serviceTrucks.id, users.homeTruckId))
    .where(and(eq(users.role, 'mechanic'), eq(users.active, true))).orderBy(asc(users.name))
  const rates = await ratesInForce()
  const averageRoadKph = rates?.averageRoadKph ?? FALLBACK_ROAD_KPH
  const at = call.lat !== null && call.lon !== null ? { lat: call.lat, lon: call.lon } : null
  const ranked = rankMechanics(rows.map(r => ({ ...r, homeTruck: r.homeTruck?.id ? r.homeTruck : null })), at, averageRoadKph)
  return {
    callId: call.id,
    callPosition: at,
    averageRoadKph,
    averageRoadKphFromRates: !!rates,
    /** Distances are shown in the unit the business bills travel in. */
    distanceUnit: rates?.travelUnit === 'mi' ? 'mi' as const : 'km' as const,
    items: ranked.map(r => ({ ...r, openCalls: r.mechanic.openCalls, assignedHere: call.mechanicId === r.mechanic.id })),
  }
}
