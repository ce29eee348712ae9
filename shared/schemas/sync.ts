// The sync protocol's payloads (DESIGN.md, "Sync protocol"): the op envelope, the push body and
// answer, the pull query, and per entity the create shape and the fields an update may carry.
// The device validates its own ops with these before queueing them; the server validates again.
import { z } from 'zod'
import { parseDtc } from '../utils/dtc'
import { CALL_OUTCOMES, CALL_STATUSES } from './calls'

export const SYNC_SCHEMA_VERSION = 1
export const SYNC_MAX_OPS = 500
/** Push bodies above this are refused (413) before they are parsed. */
export const SYNC_MAX_BODY_BYTES = 2 * 1024 * 1024
/** Deepest nesting of objects and arrays a push body may have. */
export const SYNC_MAX_DEPTH = 16
/** A drawn signature as a data URL; a few tens of KB in practice. */
export const SIGNATURE_MAX_CHARS = 300_000

export const SYNC_ENTITIES = ['call', 'reading', 'faultCode', 'note', 'photo', 'clockEvent', 'partLine', 'testRun', 'signOff', 'conflictResolution'] as const
export type SyncEntity = (typeof SYNC_ENTITIES)[number]
export const SYNC_ACTIONS = ['create', 'update'] as const
export const SYNC_OP_STATUSES = ['applied', 'duplicate', 'conflict', 'rejected'] as const
export type SyncOpStatus = (typeof SYNC_OP_STATUSES)[number]

export const READING_QUANTITIES = ['resistance', 'voltage', 'temperature', 'pressure', 'concentration', 'other'] as const
export const CLOCK_KINDS = ['travel_start', 'arrive', 'work_start', 'work_stop', 'depart'] as const
export const FAULT_STATES = ['active', 'stored'] as const
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
export const CONFLICT_CHOICES = ['device', 'server', 'value'] as const

const uuid = (what: string) => z.string().uuid(`Not a valid ${what}`)
const isoTime = z.string().datetime({ offset: true, message: 'Expected an ISO 8601 time' })
// PostgreSQL text cannot hold a NUL character; say so here rather than fail at the database.
const noNul = (s: string) => !s.includes('\u0000')
const NUL = 'May not contain a NUL character'
const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`).refine(noNul, NUL)
const required = (max: number, what: string) => z.string().trim().min(1, `Enter ${what}`).max(max, `At most ${max} characters`).refine(noNul, NUL)
const int = (min: number, max: number) => z.number().int('Expected a whole number').min(min, `At least ${min}`).max(max, `At most ${max}`)
const num = (min: number, max: number) => z.number().min(min, `At least ${min}`).max(max, `At most ${max}`)

// ── Envelope ──────────────────────────────────────────────────────────────────────────────
// The fields are checked per entity later; here only that they are a plain object (not copied).
const fieldsObject = z.custom<Record<string, unknown>>(
  v => typeof v === 'object' && v !== null && !Array.isArray(v),
  { message: 'Expected an object of fields' },
)
export const opSchema = z.object({
  opId: uuid('op id'),
  // Must equal the push's clientId (checked below), which is itself a checked UUID.
  clientId: z.string(),
  seq: int(1, Number.MAX_SAFE_INTEGER),
  at: isoTime,
  schemaVersion: int(1, SYNC_SCHEMA_VERSION),
  entity: z.enum(SYNC_ENTITIES, { message: `Unknown entity; expected one of ${SYNC_ENTITIES.join(', ')}` }),
  entityId: uuid('entity id'),
  action: z.enum(SYNC_ACTIONS, { message: 'Expected create or update' }),
  baseVersion: int(0, 2_147_483_647).optional(),
  changes: fieldsObject,
  base: fieldsObject.optional(),
})
export type Op = z.infer<typeof opSchema>

/** The mechanic's last known position, sent with their consent. */
export const positionSchema = z.object({
  lat: num(-90, 90),
  lon: num(-180, 180),
  at: isoTime,
})

export const pushBodySchema = z.object({
  clientId: uuid('client id'),
  ops: z.array(opSchema, { message: 'Expected a list of ops' }).max(SYNC_MAX_OPS, `At most ${SYNC_MAX_OPS} ops per push`),
  position: positionSchema.optional(),
}).superRefine((body, ctx) => {
  const seen = new Set<string>()
  body.ops.forEach((op, i) => {
    if (op.clientId !== body.clientId) ctx.addIssue({ code: 'custom', path: ['ops', i, 'clientId'], message: 'Differs from the push clientId' })
    if (seen.has(op.opId)) ctx.addIssue({ code: 'custom', path: ['ops', i, 'opId'], message: 'Repeated in this push' })
    seen.add(op.opId)
    const prev = body.ops[i - 1]
    if (prev && op.seq <= prev.seq) ctx.addIssue({ code: 'custom', path: ['ops', i, 'seq'], message: 'Ops must be in increasing seq order' })
  })
})
export type PushBody = z.infer<typeof pushBodySchema>

export const pushResultItemSchema = z.object({
  opId: z.string(),
  seq: z.number().int(),
  status: z.enum(SYNC_OP_STATUSES),
  version: z.number().int().optional(),
  reason: z.string().optional(),
  /** For a duplicate: what the op's first delivery answered. */
  original: z.enum(['applied', 'conflict', 'rejected']).optional(),
})
/** What a push answers; the device trusts an answer only if it parses (a captive portal says 200 too). */
export const pushResultSchema = z.object({
  lastSeq: z.number().int().min(0),
  results: z.array(pushResultItemSchema),
})
export type PushResult = z.infer<typeof pushResultSchema>

export const pullQuerySchema = z.object({
  cursor: z.string().regex(/^\d{1,20}$/, 'Expected the cursor of the last pull').optional(),
  clientId: uuid('client id').optional(),
})

// ── Creates: the smallest shapes plus the optional columns each record carries ───────────
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
  if (hasCode && (hasSpn || hasFmi)) ctx.addIssue({ code: 'custom', path: ['code'], message: 'Give either a J2012 code or a J1939 SPN/FMI, not both' })
  else if (hasCode) {
    try { parseDtc(v.code!) }
    catch (err) { ctx.addIssue({ code: 'custom', path: ['code'], message: (err as Error).message }) }
  }
  else if (!hasSpn && !hasFmi) ctx.addIssue({ code: 'custom', path: ['code'], message: 'Give a J2012 code or a J1939 SPN and FMI' })
  else if (!hasSpn) ctx.addIssue({ code: 'custom', path: ['spn'], message: 'A J1939 fault code needs an SPN' })
  else if (!hasFmi) ctx.addIssue({ code: 'custom', path: ['fmi'], message: 'A J1939 fault code needs an FMI' })
}).transform(v => (v.code ? { ...v, code: parseDtc(v.code).code } : v))

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
/** Call fields by who owns them. Field work is the mechanic's; dispatch fields the office's. */
export const CALL_FIELD_WORK_FIELDS = ['status', 'outcome', 'storyComplaint', 'storyCause', 'storyCorrection', 'sceneChecklist', 'verification', 'followUp'] as const
export const CALL_DISPATCH_FIELDS = [
  'customerId', 'unitId', 'locationText', 'lat', 'lon', 'complaint', 'lamps', 'derate', 'derateNote', 'loaded', 'hazmat',
  'safetyNotes', 'callerName', 'callerPhone', 'poNumber', 'authLimitCents', 'mechanicId', 'serviceTruckId', 'cancelReason',
] as const
/** Dispatch fields that change links to other records: set on the call screens, never by sync. */
export const CALL_LINK_FIELDS = ['customerId', 'unitId', 'mechanicId', 'serviceTruckId'] as const
export type CallFieldWorkField = (typeof CALL_FIELD_WORK_FIELDS)[number]
export type CallDispatchField = (typeof CALL_DISPATCH_FIELDS)[number]
export type CallSyncField = CallFieldWorkField | CallDispatchField

/** One schema per call field a sync update may carry (used by ops and by conflict resolution). */
export const callFieldSchemas = {
  status: z.enum(CALL_STATUSES, { message: 'Unknown status' }),
  outcome: z.enum(CALL_OUTCOMES, { message: 'Unknown outcome' }).nullable(),
  storyComplaint: text(4000).nullable(),
  storyCause: text(4000).nullable(),
  storyCorrection: text(4000).nullable(),
  sceneChecklist: z.record(z.string().max(60), z.boolean()).nullable(),
  verification: z.record(z.string().max(60), z.unknown()).nullable(),
  followUp: text(2000).nullable(),
  customerId: uuid('customer id'),
  unitId: uuid('unit id').nullable(),
  locationText: required(300, 'a location'),
  lat: num(-90, 90).nullable(),
  lon: num(-180, 180).nullable(),
  complaint: required(2000, 'the complaint'),
  lamps: z.array(text(40)).max(20),
  derate: z.enum(['none', 'derated', 'countdown', 'shutdown']),
  derateNote: text(500).nullable(),
  loaded: z.boolean(),
  hazmat: z.boolean(),
  safetyNotes: text(1000).nullable(),
  callerName: text(120).nullable(),
  callerPhone: text(40).nullable(),
  poNumber: text(60).nullable(),
  authLimitCents: int(0, 100_000_000).nullable(),
  mechanicId: uuid('mechanic id').nullable(),
  serviceTruckId: uuid('service truck id').nullable(),
  cancelReason: text(500).nullable(),
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

export const createSchemas = {
  reading: readingCreateSchema,
  faultCode: faultCodeCreateSchema,
  note: noteCreateSchema,
  photo: photoCreateSchema,
  clockEvent: clockEventCreateSchema,
  partLine: partLineCreateSchema,
  testRun: testRunCreateSchema,
  signOff: signOffCreateSchema,
} as const
export type ChildEntity = keyof typeof createSchemas
export type ChildCreate<E extends ChildEntity> = z.output<(typeof createSchemas)[E]>

export const updateSchemas = {
  call: callUpdateSchema,
  faultCode: faultCodeUpdateSchema,
  testRun: testRunUpdateSchema,
} as const
