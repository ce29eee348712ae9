// The call module's pure part: the statuses a call moves through, the named sets other code asks
// about, the moves the order allows, and who may reach a call. Both sides import it (the phone, the
// office pages, dispatch, billing, the sync merge); the database enums take the same arrays.
import type { Role } from './roles'

export const CALL_STATUSES = ['received', 'assigned', 'en_route', 'on_site', 'completed', 'invoiced', 'paid', 'cancelled'] as const
export const CALL_OUTCOMES = ['repaired', 'towed', 'parts_ordered', 'no_fault_found'] as const
export type CallStatus = (typeof CALL_STATUSES)[number]
export type CallOutcome = (typeof CALL_OUTCOMES)[number]

/** The order a call moves through; `cancelled` sits outside it. */
export const STATUS_ORDER: readonly CallStatus[] = ['received', 'assigned', 'en_route', 'on_site', 'completed', 'invoiced', 'paid']

/** Work not finished yet: on the board and the phone's list of open calls. */
export const OPEN_STATUSES = ['received', 'assigned', 'en_route', 'on_site'] as const satisfies readonly CallStatus[]
/** A mechanic has it in hand: counts as their load. */
export const WORKING_STATUSES = ['assigned', 'en_route', 'on_site'] as const satisfies readonly CallStatus[]
/** The work is done: the call has (or may have) an outcome. */
export const DONE_STATUSES = ['completed', 'invoiced', 'paid'] as const satisfies readonly CallStatus[]
/** Not open work any more: finished one way or the other. */
export const CLOSED_STATUSES = ['completed', 'invoiced', 'paid', 'cancelled'] as const satisfies readonly CallStatus[]
/** An invoice was priced from the record: it takes no new work. */
export const BILLED_STATUSES = ['invoiced', 'paid'] as const satisfies readonly CallStatus[]
/** Closed to field work, by sync or by the office: billed, or cancelled. */
export const LOCKED_STATUSES = ['invoiced', 'paid', 'cancelled'] as const satisfies readonly CallStatus[]
/** Ready to be invoiced. */
export const BILLABLE_STATUSES = ['completed'] as const satisfies readonly CallStatus[]

const isIn = (set: readonly CallStatus[]) => (s: CallStatus | string) => (set as readonly string[]).includes(s)
/** A named set as an SQL list literal, `'completed', 'invoiced', 'paid'`, for checks and reports written in SQL. */
export const sqlStatusList = (set: readonly CallStatus[]) => set.map(s => `'${s}'`).join(', ')

export const isOpenStatus = isIn(OPEN_STATUSES)
export const isClosedStatus = isIn(CLOSED_STATUSES)
export const isDoneStatus = isIn(DONE_STATUSES)
export const isBilledStatus = isIn(BILLED_STATUSES)
/** Invoiced, paid and cancelled calls are closed to field changes (on the phone and on the server). */
export const isLockedStatus = isIn(LOCKED_STATUSES)
export const isBillableStatus = isIn(BILLABLE_STATUSES)

export const STATUS_LABELS: Record<CallStatus, string> = {
  received: 'Waiting for a mechanic',
  assigned: 'Assigned',
  en_route: 'Driving out',
  on_site: 'At the truck',
  completed: 'Work done',
  invoiced: 'Billed',
  paid: 'Paid',
  cancelled: 'Cancelled',
}

export const OUTCOME_LABELS: Record<CallOutcome, string> = {
  repaired: 'Repaired at the roadside',
  towed: 'Towed in',
  parts_ordered: 'Parts ordered, return visit',
  no_fault_found: 'No fault found',
}

/** The call column that keeps when a call reached each status (received is set when it is taken). */
export const STATUS_TIME_FIELD = {
  received: 'receivedAt',
  assigned: 'assignedAt',
  en_route: 'enRouteAt',
  on_site: 'onSiteAt',
  completed: 'completedAt',
  invoiced: 'invoicedAt',
  paid: 'paidAt',
  cancelled: 'cancelledAt',
} as const satisfies Record<CallStatus, string>

/** Rank in the status order, or -1 for cancelled. */
export function statusRank(s: CallStatus): number {
  return STATUS_ORDER.indexOf(s)
}

/** Whether moving `from` → `to` follows the order (forward only; cancel only before the work is done). */
export function canMoveStatus(from: CallStatus, to: CallStatus): boolean {
  if (from === to) return true
  if (from === 'cancelled') return false
  if (to === 'cancelled') return statusRank(from) < statusRank('completed')
  return statusRank(to) > statusRank(from)
}

/** Statuses a mechanic's running clock can be paused from (they drove out, or are at the truck). */
export const PAUSABLE_STATUSES = ['en_route', 'on_site'] as const satisfies readonly CallStatus[]

/**
 * A pause: the mechanic started on another of their calls, so this one goes back to assigned until
 * they return to it. The one back move sync takes (see server/utils/sync/merge.ts).
 */
export function isPauseMove(from: CallStatus, to: CallStatus): boolean {
  return to === 'assigned' && (PAUSABLE_STATUSES as readonly string[]).includes(from)
}

/**
 * The time columns a move writes (call properties → value). Forward, or to the same status as a
 * reassignment: its status's time. A pause keeps every time: enRouteAt (and onSiteAt) still say
 * when the call was driven out to and reached, which is how the board knows a paused call from a
 * fresh one (isPausedCall); the timeline holds the pause, and driving out again stamps enRouteAt
 * anew. Back otherwise (a refund reopens a paid call): the later statuses' times cleared, its own
 * kept. statusChangedAt whenever the status changes.
 */
export function statusTimes(from: CallStatus, to: CallStatus, at: Date): Record<string, Date | null> {
  const set: Record<string, Date | null> = {}
  if (isPauseMove(from, to)) return { statusChangedAt: at }
  const back = to !== 'cancelled' && from !== 'cancelled' && statusRank(to) < statusRank(from)
  if (back) for (const s of STATUS_ORDER.slice(statusRank(to) + 1, statusRank(from) + 1)) set[STATUS_TIME_FIELD[s]] = null
  else set[STATUS_TIME_FIELD[to]] = at
  if (from !== to) set.statusChangedAt = at
  return set
}

/**
 * Moves each role may make from the field (the phone's status buttons, by sync); billing and
 * assignment have their own routes. `assigned` only as a pause (isPauseMove), never as an assignment.
 */
export const FIELD_STATUS_TARGETS: Record<Role, readonly CallStatus[]> = {
  mechanic: ['assigned', 'en_route', 'on_site', 'completed'],
  office: ['assigned', 'en_route', 'on_site', 'completed'],
  dispatcher: ['assigned', 'en_route', 'on_site', 'completed', 'cancelled'],
  admin: ['assigned', 'en_route', 'on_site', 'completed', 'cancelled'],
}

/** Why an outcome cannot stand with this status (the calls table's rule), or undefined. */
export function outcomeProblem(status: CallStatus, outcome: unknown): string | undefined {
  if (outcome != null && !isDoneStatus(status)) return 'outcome: a call gets its outcome once the work is done'
  return undefined
}

// ── Call fields and who owns them ─────────────────────────────────────────────────────────
/** Field work is the mechanic's (the phone writes it); dispatch fields are the office's. */
export const CALL_FIELD_WORK_FIELDS = [
  'status', 'outcome', 'storyComplaint', 'storyCause', 'storyCorrection', 'sceneChecklist', 'verification', 'followUp', 'afterDecline',
  'odometerReading', 'engineHoursReading',
] as const
export const CALL_DISPATCH_FIELDS = [
  'customerId', 'unitId', 'locationText', 'lat', 'lon', 'complaint', 'lamps', 'derate', 'derateNote', 'loaded', 'hazmat',
  'safetyNotes', 'callerName', 'callerPhone', 'poNumber', 'authLimitCents', 'mechanicId', 'serviceTruckId', 'cancelReason',
] as const
/** Dispatch fields that change links to other records: set on the call screens (assign, edit), never by sync. */
export const CALL_LINK_FIELDS = ['customerId', 'unitId', 'mechanicId', 'serviceTruckId'] as const
export type CallFieldWorkField = (typeof CALL_FIELD_WORK_FIELDS)[number]
export type CallDispatchField = (typeof CALL_DISPATCH_FIELDS)[number]
export type CallSyncField = CallFieldWorkField | CallDispatchField

/** fieldWork: the mechanic's; dispatch: the office's; link: dispatch fields set only on the call screens. */
export type CallFieldOwner = 'fieldWork' | 'dispatch' | 'link'

export function callFieldOwner(field: string): CallFieldOwner | undefined {
  if ((CALL_LINK_FIELDS as readonly string[]).includes(field)) return 'link'
  if ((CALL_FIELD_WORK_FIELDS as readonly string[]).includes(field)) return 'fieldWork'
  if ((CALL_DISPATCH_FIELDS as readonly string[]).includes(field)) return 'dispatch'
  return undefined
}

/** Who may change each kind of call field by sync. */
export const CALL_FIELD_WRITERS: Record<CallFieldOwner, readonly Role[]> = {
  fieldWork: ['mechanic', 'dispatcher', 'office', 'admin'],
  dispatch: ['dispatcher', 'admin'],
  link: [],
}

// ── Access ────────────────────────────────────────────────────────────────────────────────
/** Who is asking and which call: enough to decide access without the database. */
export type CallReader = { id: string, role: Role }
export type CallOwner = { mechanicId: string | null }

/** A mechanic reaches only the calls assigned to them; the office roles reach every call. */
export function canSeeCall(user: CallReader, call: CallOwner): boolean {
  return user.role !== 'mechanic' || call.mechanicId === user.id
}

/** Who may add work to a call and change it (within their fields): the same people who may see it. */
export function canWriteCall(user: CallReader, call: CallOwner): boolean {
  return canSeeCall(user, call)
}
