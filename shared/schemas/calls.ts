import { z } from 'zod'
import { centsSchema } from './money'
import { optText, recordId, versionField } from './fields'
import { cleanText, requiredText, searchQuery } from './text'
import { customerCreateSchema } from './customers'
import { unitDraftSchema } from './units'
import { CALL_OUTCOMES, CALL_STATUSES, type CallOutcome, type CallStatus } from '../utils/callStatus'
import { DERATE_LABELS, DERATE_STATES, LAMP_LABELS, LAMPS } from '../utils/callWords'

// The statuses and outcomes live with the call module (shared/utils/callStatus.ts).
export { CALL_OUTCOMES, CALL_STATUSES, type CallOutcome, type CallStatus }

/** Query of GET /api/calls; `status` may list several, comma-separated. */
export const callListQuerySchema = z.object({
  status: z.string().optional().transform((s, ctx) => {
    if (!s) return undefined
    const list = s.split(',').map(x => x.trim()).filter(Boolean)
    for (const x of list) {
      if (!(CALL_STATUSES as readonly string[]).includes(x)) {
        ctx.addIssue({ code: 'custom', message: `Unknown status "${x}"` })
        return z.NEVER
      }
    }
    return list as CallStatus[]
  }),
  // `open=1` as well as `open=true`, since both get typed into addresses.
  open: z.enum(['true', 'false', '1', '0'], { message: 'open is true or false (or 1 or 0)' }).optional()
    .transform(v => v === 'true' || v === '1'),
  mechanicId: z.string().uuid('Not a valid mechanic id').optional(),
  customerId: z.string().uuid('Not a valid customer id').optional(),
  unitId: z.string().uuid('Not a valid unit id').optional(),
  q: searchQuery,
  sort: z.enum(['number', 'receivedAt', 'statusChangedAt', 'status']).optional(),
  dir: z.enum(['asc', 'desc']).optional(),
  page: z.coerce.number({ message: 'Page must be a number' }).int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number({ message: 'Page size must be a number' }).int().min(1).max(200).default(50),
  /** The `next` of the page before: goes on from there by the sort key's index instead of counting rows (page is then ignored). */
  after: z.string().max(200, 'after: not a cursor this list gave').optional(),
})
export type CallListQuery = z.input<typeof callListQuerySchema>

// ── Taking and editing a call (dispatch fields) ─────────────────────────────────────────────

export { DERATE_LABELS, DERATE_STATES, LAMP_LABELS, LAMPS }

const latField = z.number({ message: 'Latitude must be a number' })
  .min(-90, 'Latitude is from -90 to 90').max(90, 'Latitude is from -90 to 90').nullable().optional()
const lonField = z.number({ message: 'Longitude must be a number' })
  .min(-180, 'Longitude is from -180 to 180').max(180, 'Longitude is from -180 to 180').nullable().optional()

/** The dispatch fields as the office edits them; sync's call fields take the same schemas. */
export const dispatchFields = {
  locationText: requiredText(300, 'Location', { missing: 'Say where the truck is' }),
  lat: latField,
  lon: lonField,
  complaint: requiredText(2000, 'Complaint', { multiline: true, missing: 'Write the driver\'s complaint' }),
  lamps: z.array(cleanText('A lamp name').min(1, 'Name the lamp').max(40, 'A lamp name is at most 40 characters'),
    { message: 'Lamps must be a list' }).max(12, 'At most 12 lamps'),
  derate: z.enum(DERATE_STATES, { message: 'Pick how the engine runs' }),
  derateNote: optText(300, 'Derate note'),
  loaded: z.boolean({ message: 'Loaded must be yes or no' }),
  hazmat: z.boolean({ message: 'Hazmat must be yes or no' }),
  safetyNotes: optText(1000, 'Safety notes', { multiline: true }),
  callerName: optText(120, 'Caller name'),
  callerPhone: optText(40, 'Caller phone'),
  poNumber: optText(60, 'PO number'),
  authLimitCents: centsSchema('Authorization limit').nullable().optional(),
}

// A position is a pair; half of one would place the truck on the equator or the prime meridian.
function positionRule(v: { lat?: number | null, lon?: number | null }, ctx: z.RefinementCtx) {
  const hasLat = v.lat !== null && v.lat !== undefined
  const hasLon = v.lon !== null && v.lon !== undefined
  if (hasLat && !hasLon) ctx.addIssue({ code: 'custom', path: ['lon'], message: 'Give the longitude too, or clear the latitude' })
  if (hasLon && !hasLat) ctx.addIssue({ code: 'custom', path: ['lat'], message: 'Give the latitude too, or clear the longitude' })
}

/**
 * POST /api/calls. The customer and the unit are either picked (`customerId`, `unitId`) or taken
 * inline (`newCustomer`, `newUnit`); all of it is written in one transaction. A `mechanicId`
 * assigns the call at once.
 */
export const callCreateSchema = z.object({
  customerId: recordId('the customer, or add a new one').optional(),
  newCustomer: customerCreateSchema.optional(),
  unitId: recordId('the unit').nullable().optional(),
  newUnit: unitDraftSchema.optional(),
  ...dispatchFields,
  lamps: dispatchFields.lamps.default([]),
  derate: dispatchFields.derate.default('none'),
  loaded: dispatchFields.loaded.default(false),
  hazmat: dispatchFields.hazmat.default(false),
  mechanicId: recordId('a mechanic').optional(),
  serviceTruckId: recordId('a service truck').nullable().optional(),
}).superRefine((v, ctx) => {
  if (!v.customerId && !v.newCustomer) {
    ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Pick the customer, or add a new one' })
  }
  if (v.customerId && v.newCustomer) {
    ctx.addIssue({ code: 'custom', path: ['customerId'], message: 'Pick a customer or add a new one, not both' })
  }
  if (v.unitId && v.newUnit) ctx.addIssue({ code: 'custom', path: ['unitId'], message: 'Pick a unit or add a new one, not both' })
  if (v.newCustomer && v.unitId) {
    ctx.addIssue({ code: 'custom', path: ['unitId'], message: 'A new customer has no units yet: add the unit as new' })
  }
  positionRule(v, ctx)
})

/** PATCH /api/calls/[id]: dispatch fields only, with the version the editor started from. */
export const callPatchSchema = z.object({
  version: versionField,
  customerId: recordId('the customer').optional(),
  unitId: recordId('the unit').nullable().optional(),
  locationText: dispatchFields.locationText.optional(),
  lat: dispatchFields.lat,
  lon: dispatchFields.lon,
  complaint: dispatchFields.complaint.optional(),
  lamps: dispatchFields.lamps.optional(),
  derate: dispatchFields.derate.optional(),
  derateNote: dispatchFields.derateNote,
  loaded: dispatchFields.loaded.optional(),
  hazmat: dispatchFields.hazmat.optional(),
  safetyNotes: dispatchFields.safetyNotes,
  callerName: dispatchFields.callerName,
  callerPhone: dispatchFields.callerPhone,
  poNumber: dispatchFields.poNumber,
  authLimitCents: dispatchFields.authLimitCents,
}).superRefine((v, ctx) => {
  if (v.lat !== undefined || v.lon !== undefined) positionRule(v, ctx)
})

/** The dispatch fields a PATCH may change, in the order the call page lists them. */
export const CALL_EDIT_FIELDS = [
  'customerId', 'unitId', 'locationText', 'lat', 'lon', 'complaint', 'lamps', 'derate', 'derateNote', 'loaded', 'hazmat',
  'safetyNotes', 'callerName', 'callerPhone', 'poNumber', 'authLimitCents',
] as const
export type CallEditField = (typeof CALL_EDIT_FIELDS)[number]

export const callAssignSchema = z.object({
  mechanicId: recordId('a mechanic'),
  serviceTruckId: recordId('a service truck').nullable().optional(),
})

export const callCancelSchema = z.object({
  reason: requiredText(500, 'Reason', { multiline: true, missing: 'Say why the call is cancelled' })
    .min(3, 'Say why the call is cancelled'),
  version: versionField.optional(),
})

export type CallCreateInput = z.input<typeof callCreateSchema>
export type CallPatchInput = z.input<typeof callPatchSchema>
export type CallAssignInput = z.input<typeof callAssignSchema>
