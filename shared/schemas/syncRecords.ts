// What each synced entity carries: per record the create shape (the smallest shape in DESIGN.md
// plus the optional columns it keeps) and the fields an update may carry. The entity registry
// (shared/sync/entities.ts) names these per entity; the device checks its ops with them before it
// queues them, the server again when they arrive.
import { z } from 'zod'
import { parseDtc } from '../utils/dtc'
import { CALL_OUTCOMES, CALL_STATUSES, type CallSyncField } from '../utils/callStatus'
import { callCancelSchema, dispatchFields } from './calls'
import { cleanText } from './text'
import { DECLINE_CHOICES } from './approvals'
import { truckReadingFields } from './truckReadings'

/** A drawn signature as a data URL; a few tens of KB in practice. */
export const SIGNATURE_MAX_CHARS = 300_000

export const READING_QUANTITIES = ['resistance', 'voltage', 'temperature', 'pressure', 'concentration', 'other'] as const
/** `pause` ends whatever runs on a call (travel or work) when its mechanic starts on another call. */
export const CLOCK_KINDS = ['travel_start', 'arrive', 'work_start', 'work_stop', 'depart', 'pause'] as const
export type ClockKind = (typeof CLOCK_KINDS)[number]
export const FAULT_STATES = ['active', 'stored'] as const
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
export const CONFLICT_CHOICES = ['device', 'server', 'value'] as const

const uuid = (what: string) => z.string().uuid(`Not a valid ${what}`)
export const isoTime = z.string().datetime({ offset: true, message: 'Expected an ISO 8601 time' })
// Through the one text schema: a phone's text with a NUL or another control character is refused by name.
const text = (max: number) => cleanText('This', { multiline: true }).max(max, `At most ${max} characters`)
const required = (max: number, what: string) =>
  cleanText(what, { multiline: true }).min(1, `Enter ${what}`).max(max, `At most ${max} characters`)
const int = (min: number, max: number) => z.number().int('Expected a whole number').min(min, `At least ${min}`).max(max, `At most ${max}`)
const num = (min: number, max: number) => z.number().min(min, `At least ${min}`).max(max, `At most ${max}`)

// ── Creates ───────────────────────────────────────────────────────────────────────────────
const callId = uuid('call id')

export const judgeSpecSchema = z.looseObject({
  min: z.number().optional(),
  max: z.number().optional(),
  nominal: z.number().optional(),
  tolerance: z.number().min(0).optional(),
  tolerancePct: z.number().min(0).optional(),
})

export const readingCreateSchema = z.object({
  callId,
  label: required(200, 'a label'),
  quantity: z.enum(READING_QUANTITIES, { message: `Expected one of ${READING_QUANTITIES.join(', ')}` }),
  value: z.number(),
  unit: required(20, 'a unit'),
  testRunId: uuid('test run id').nullish(),
  stepId: text(100).nullish(),
  component: text(200).nullish(),
  pins: text(100).nullish(),
  conditions: text(200).nullish(),
  partRole: z.enum(['installed', 'new']).nullish(),
  spec: judgeSpecSchema.nullish(),
  verdict: z.enum(['pass', 'low', 'high']).nullish(),
})

export const faultCodeCreateSchema = z.object({
  callId,
  code: text(10).nullish(),
  spn: int(0, 524287).nullish(),
  fmi: int(0, 31).nullish(),
  state: z.enum(FAULT_STATES).nullish(),
  count: int(0, 127).nullish(),
  source: text(100).nullish(),
  clearedAt: isoTime.nullish(),
  note: text(2000).nullish(),
}).superRefine((v, ctx) => {
  const hasCode = !!v.code
  const hasSpn = v.spn !== undefined && v.spn !== null
  const hasFmi = v.fmi !== undefined && v.fmi !== null
  const issue = (field: string, message: string) => ctx.addIssue({ code: 'custom', path: [field], message })
  if (hasCode && (hasSpn || hasFmi)) issue('code', 'Give either a J2012 code or a J1939 SPN/FMI, not both')
  else if (hasCode) {
    try {
      parseDtc(v.code!)
    }
    catch (err) {
      issue('code', (err as Error).message)
    }
  }
  else if (!hasSpn && !hasFmi) issue('code', 'Give a J2012 code or a J1939 SPN and FMI')
  else if (!hasSpn) issue('spn', 'A J1939 fault code needs an SPN')
  else if (!hasFmi) issue('fmi', 'A J1939 fault code needs an FMI')
  // The stored row: the code as J2012 writes it, and the columns' defaults filled in.
}).transform(v => ({ ...v, code: v.code ? parseDtc(v.code).code : v.code, state: v.state ?? 'active', count: v.count ?? 1 }))

export const noteCreateSchema = z.object({ callId, text: required(10_000, 'the note') })

export const clockEventCreateSchema = z.object({
  callId,
  kind: z.enum(CLOCK_KINDS, { message: `Expected one of ${CLOCK_KINDS.join(', ')}` }),
})

/** Photo metadata; the bytes follow by PUT /api/photos/[id]. */
export const photoCreateSchema = z.object({
  callId,
  sha256: z.string().regex(/^[0-9a-fA-F]{64}$/, 'Expected the hex SHA-256 of the bytes').transform(s => s.toLowerCase()),
  contentType: z.enum(PHOTO_TYPES, { message: `Expected one of ${PHOTO_TYPES.join(', ')}` }),
  sizeBytes: int(1, 2_000_000_000),
  caption: text(500).nullish(),
})

export const partLineCreateSchema = z.object({
  callId,
  partNumber: required(60, 'a part number'),
  description: required(300, 'a description'),
  quantity: z.number().gt(0, 'Must be more than 0').max(10_000, 'At most 10000'),
  unitPriceCents: int(0, 100_000_000).optional(),
  coreChargeCents: int(0, 100_000_000).optional(),
  serviceTruckId: uuid('service truck id').nullish(),
})

export const testRunCreateSchema = z.object({
  callId,
  cardId: uuid('test card id'),
  cardVersion: int(1, 1_000_000),
  ambientC: num(-60, 80).nullish(),
  steps: z.array(z.record(z.string(), z.unknown()), { message: 'Expected a list of steps' }).max(500, 'At most 500 steps'),
  conclusion: text(4000).nullish(),
  finishedAt: isoTime.nullish(),
})

export const signOffCreateSchema = z.object({
  callId,
  driverName: required(120, 'the driver\'s name'),
  signature: z.string()
    .max(SIGNATURE_MAX_CHARS, 'The signature image is too large')
    .regex(/^data:image\/(png|jpeg|webp|svg\+xml);base64,[A-Za-z0-9+/]+={0,2}$/, 'Expected the drawn signature as an image data URL'),
})

const needsValue = (v: { choice: string, value?: unknown }, ctx: z.RefinementCtx) => {
  if (v.choice === 'value' && !('value' in v)) ctx.addIssue({ code: 'custom', path: ['value'], message: 'Give the value to keep' })
}
const conflictChoice = {
  choice: z.enum(CONFLICT_CHOICES, { message: 'Expected device, server or value' }),
  value: z.unknown().optional(),
}
/** The `conflictResolution` op's changes: settles a conflict from the device. */
export const conflictResolutionSchema = z.object({ conflictId: uuid('conflict id'), ...conflictChoice }).superRefine(needsValue)
/** POST /api/conflicts/[id]/resolve */
export const conflictResolveBodySchema = z.object(conflictChoice).superRefine(needsValue)
export const conflictListQuerySchema = z.object({
  callId: uuid('call id').optional(),
  status: z.enum(['open', 'resolved', 'all']).default('open'),
})

// ── Updates ───────────────────────────────────────────────────────────────────────────────
// Which call fields belong to whom is the call module's (shared/utils/callStatus.ts).
export {
  CALL_DISPATCH_FIELDS, CALL_FIELD_WORK_FIELDS, CALL_LINK_FIELDS,
  type CallDispatchField, type CallFieldWorkField, type CallSyncField,
} from '../utils/callStatus'

/**
 * One schema per call field a sync update may carry (used by ops and by conflict resolution). The
 * dispatch fields are the office form's own (shared/schemas/calls.ts), so PATCH and sync agree.
 */
export const callFieldSchemas = {
  status: z.enum(CALL_STATUSES, { message: 'Unknown status' }),
  outcome: z.enum(CALL_OUTCOMES, { message: 'Unknown outcome' }).nullable(),
  storyComplaint: text(4000).nullable(),
  storyCause: text(4000).nullable(),
  storyCorrection: text(4000).nullable(),
  sceneChecklist: z.record(z.string().max(60), z.boolean()).nullable(),
  verification: z.record(z.string().max(60), z.unknown()).nullable(),
  followUp: text(2000).nullable(),
  afterDecline: z.enum(DECLINE_CHOICES, { message: `Expected one of ${DECLINE_CHOICES.join(', ')}` }).nullable(),
  ...truckReadingFields,
  ...dispatchFields,
  customerId: uuid('customer id'),
  unitId: uuid('unit id').nullable(),
  mechanicId: uuid('mechanic id').nullable(),
  serviceTruckId: uuid('service truck id').nullable(),
  cancelReason: callCancelSchema.shape.reason.nullable(),
} satisfies Record<CallSyncField, z.ZodType>

export const callUpdateSchema = z.strictObject(callFieldSchemas).partial()

export const faultCodeUpdateSchema = z.strictObject({
  state: z.enum(FAULT_STATES),
  count: int(0, 127),
  clearedAt: isoTime.nullable(),
  note: text(2000).nullable(),
}).partial()

export const testRunUpdateSchema = z.strictObject({
  steps: testRunCreateSchema.shape.steps,
  conclusion: text(4000).nullable(),
  finishedAt: isoTime.nullable(),
}).partial()
