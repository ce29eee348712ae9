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

// ── Pull ──────────────────────────────────────────────────────────────────────────────────
/** Rows a pull page carries when the device does not say. */
export const SYNC_PULL_DEFAULT_LIMIT = 2000
export const SYNC_PULL_MAX_LIMIT = 10_000

/**
 * Where a paged pull stands: the window of changes it hands out (from, upto) and, between pages,
 * the collection it stopped in and the last id it gave. A finished pull's cursor is just `upto`.
 */
export type PullPosition = { from: string, upto?: string, k?: number, after?: string }
const PAGE_CURSOR = /^(\d{1,20})\.(\d{1,20})\.(\d{1,2})\.([0-9a-f-]{36})?$/

/** The cursor of the next page: `from.upto.collection.lastId`. */
export function pullCursor(p: Required<Pick<PullPosition, 'from' | 'upto' | 'k'>> & { after?: string }): string {
  return `${p.from}.${p.upto}.${p.k}.${p.after ?? ''}`
}

/** A cursor this server gave, read back; undefined for anything else. */
export function parsePullCursor(cursor: string): PullPosition | undefined {
  if (/^\d{1,20}$/.test(cursor)) return { from: cursor }
  const m = PAGE_CURSOR.exec(cursor)
  if (!m) return undefined
  return { from: m[1]!, upto: m[2]!, k: Number(m[3]), ...(m[4] ? { after: m[4] } : {}) }
}

export const pullQuerySchema = z.object({
  cursor: z.string().refine(c => !!parsePullCursor(c), 'Expected the cursor of the last pull').optional(),
  clientId: uuid('client id').optional(),
  limit: z.coerce.number({ message: 'Expected a number of rows' }).pipe(int(1, SYNC_PULL_MAX_LIMIT)).optional(),
})

const pulledRow = z.object({ id: z.string() }).passthrough()
const pulledRows = z.array(pulledRow)
/** What a pull answers, page by page; the server's answer is typed by it and the device checks it. */
export const pullAnswerSchema = z.object({
  /** The next page's cursor while `more`; else the cursor for the next pull. */
  cursor: z.string(),
  more: z.boolean(),
  lastSeq: z.number().int().min(0),
  /** Rows by collection: calls, units, customers, each record collection of the registry, callEvents, conflicts, testCards, rates. */
  changes: z.object({
    calls: pulledRows, units: pulledRows, customers: pulledRows, callEvents: pulledRows, conflicts: pulledRows,
    testCards: pulledRows, rates: pulledRows,
  }).catchall(pulledRows),
  /** The open conflicts on the user's calls (a mechanic) or raised by them (the office). */
  conflicts: pulledRows,
  /** Calls taken away from this mechanic since the cursor: the phone drops them. */
  revokedCallIds: z.array(z.string()),
})
export type PullAnswer = z.infer<typeof pullAnswerSchema>
