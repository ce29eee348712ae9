// The sync protocol's payloads (DESIGN.md, "Sync protocol"): the op envelope, the push body and
// answer, the pull query and answer. What each entity's op carries is in ./syncRecords.ts, named
// per entity by the registry (shared/sync/entities.ts). The device checks its ops with these before
// queueing them; the server checks again.
import { z } from 'zod'
import { SYNC_ENTITY_NAMES } from '../sync/entities'

export * from './syncRecords'

export const SYNC_SCHEMA_VERSION = 1
export const SYNC_MAX_OPS = 500
/** Push bodies above this are refused (413) before they are parsed. */
export const SYNC_MAX_BODY_BYTES = 2 * 1024 * 1024
/** Deepest nesting of objects and arrays a push body may have. */
export const SYNC_MAX_DEPTH = 16
/** The entity names an op may carry: the registry's. */
export const SYNC_ENTITIES = SYNC_ENTITY_NAMES
export type SyncEntity = (typeof SYNC_ENTITIES)[number]
export const SYNC_ACTIONS = ['create', 'update'] as const
export const SYNC_OP_STATUSES = ['applied', 'duplicate', 'conflict', 'rejected'] as const
export type SyncOpStatus = (typeof SYNC_OP_STATUSES)[number]

const uuid = (what: string) => z.string().uuid(`Not a valid ${what}`)
const isoTime = z.string().datetime({ offset: true, message: 'Expected an ISO 8601 time' })
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
    const issue = (field: string, message: string) => ctx.addIssue({ code: 'custom', path: ['ops', i, field], message })
    if (op.clientId !== body.clientId) issue('clientId', 'Differs from the push clientId')
    if (seen.has(op.opId)) issue('opId', 'Repeated in this push')
    seen.add(op.opId)
    const prev = body.ops[i - 1]
    if (prev && op.seq <= prev.seq) issue('seq', 'Ops must be in increasing seq order')
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
