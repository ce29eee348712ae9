// The one registry of synced entities. For each: the name ops carry, where its rows travel (the
// pull's `changes` key, the phone's bundle collection and the server's table, all one name), the
// create schema, the fields a device may change in place, whether it is append-only, its words for
// people and its one-line summary. The phone writes and summarises from it; the server's applier
// and pull read from it. Adding a record: an entry here, a table named like its collection in
// server/db/schema.ts, and a migration (server rules in server/utils/sync/recordRules.ts only if the
// server must check or complete something the schema cannot).
import type { z } from 'zod'
import { CLOCK_KINDS, type ClockKind } from '../schemas/syncRecords'
import {
  callUpdateSchema, clockEventCreateSchema, conflictResolutionSchema, faultCodeCreateSchema, faultCodeUpdateSchema,
  noteCreateSchema, partLineCreateSchema, photoCreateSchema, readingCreateSchema, signOffCreateSchema, testRunCreateSchema,
  testRunUpdateSchema,
} from '../schemas/syncRecords'
import { describeIssues } from '../utils/fieldErrors'
import { approvalRequestCreateSchema } from '../schemas/approvals'
import { estimateSignatureCreateSchema } from '../schemas/estimateSignature'
import { formatCents } from '../utils/money'

type Changes = Record<string, unknown>
export type OpAction = 'create' | 'update'

export interface EntityWords {
  /** "reading" */
  one: string
  /** "readings" */
  many: string
}

interface EntityBase {
  words: EntityWords
  /** Words for the fields an update may carry (for the sync panel and conflicts). */
  fieldWords?: Readonly<Record<string, string>>
  /** The op in a line of plain words, for the sync panel and the journal. */
  summary: (action: OpAction, changes: Changes) => string
}

/** A record the mechanic adds to a call: created on the device, kept under its collection. */
export interface RecordEntity extends EntityBase {
  kind: 'record'
  collection: string
  create: z.ZodType<Changes, Changes>
  /** Fields a device may change in place; none for an append-only record. */
  updatable: readonly string[]
  update?: z.ZodType<Changes, Changes>
  appendOnly: boolean
}

/** The call itself: taken by dispatch, changed field by field by sync (merged three ways). */
export interface CallEntity extends EntityBase {
  kind: 'call'
  collection: 'calls'
  updatable: readonly string[]
  update: z.ZodType<Changes, Changes>
  appendOnly: false
}

/** An action with no row of its own (settling a conflict from the device). */
export interface CommandEntity extends EntityBase {
  kind: 'command'
  command: z.ZodType<Changes, Changes>
  appendOnly: true
}

export type EntityDef = RecordEntity | CallEntity | CommandEntity

const cut = (s: unknown, n = 40) => {
  const t = String(s ?? '')
  return t.length > n ? `${t.slice(0, n - 1)}…` : t
}
const keysOf = (s: { shape: object }) => Object.keys(s.shape)

export const CLOCK_WORDS: Record<ClockKind, string> = {
  travel_start: 'Started driving', arrive: 'Arrived', work_start: 'Work started', work_stop: 'Work stopped', depart: 'Left the scene',
  pause: 'Paused for another call',
}

export const CALL_FIELD_WORDS: Readonly<Record<string, string>> = {
  status: 'status', outcome: 'outcome', storyComplaint: 'complaint', storyCause: 'cause', storyCorrection: 'correction',
  sceneChecklist: 'scene checklist', verification: 'verification', followUp: 'follow-up', afterDecline: 'what was done after the decline',
  odometerReading: 'odometer', engineHoursReading: 'engine hours',
  customerId: 'customer', unitId: 'unit',
  locationText: 'location', lat: 'latitude', lon: 'longitude', complaint: 'driver\'s complaint', lamps: 'lamps', derate: 'derate state',
  derateNote: 'derate note', loaded: 'loaded', hazmat: 'hazmat', safetyNotes: 'safety notes', callerName: 'caller',
  callerPhone: 'caller phone', poNumber: 'PO number', authLimitCents: 'authorization limit', mechanicId: 'mechanic',
  serviceTruckId: 'service truck', cancelReason: 'cancel reason',
}

/** "Call changed: cause, correction" */
const changedSummary = (title: string, words: Readonly<Record<string, string>>) =>
  (_action: OpAction, c: Changes) => `${title} changed: ${Object.keys(c).map(k => words[k] ?? k).join(', ')}`

const FAULT_CODE_WORDS = { state: 'state', count: 'count', clearedAt: 'cleared', note: 'note' }
const TEST_RUN_WORDS = { steps: 'steps', conclusion: 'conclusion', finishedAt: 'finished' }

/**
 * The registry. Records are written in this order within a push (a reading may point at a test run
 * sent in the same push, so test runs come first).
 */
export const SYNC_ENTITIES = {
  call: {
    kind: 'call',
    collection: 'calls',
    update: callUpdateSchema,
    updatable: keysOf(callUpdateSchema),
    appendOnly: false,
    words: { one: 'call', many: 'calls' },
    fieldWords: CALL_FIELD_WORDS,
    summary: changedSummary('Call', CALL_FIELD_WORDS),
  },
  testRun: {
    kind: 'record',
    collection: 'testRuns',
    create: testRunCreateSchema,
    update: testRunUpdateSchema,
    updatable: keysOf(testRunUpdateSchema),
    appendOnly: false,
    words: { one: 'test run', many: 'test runs' },
    fieldWords: TEST_RUN_WORDS,
    summary: (action, c) => (action === 'update' ? changedSummary('Test run', TEST_RUN_WORDS)(action, c) : 'Test card run'),
  },
  faultCode: {
    kind: 'record',
    collection: 'faultCodes',
    create: faultCodeCreateSchema,
    update: faultCodeUpdateSchema,
    updatable: keysOf(faultCodeUpdateSchema),
    appendOnly: false,
    words: { one: 'fault code', many: 'fault codes' },
    fieldWords: FAULT_CODE_WORDS,
    summary: (action, c) => (action === 'update'
      ? changedSummary('Fault code', FAULT_CODE_WORDS)(action, c)
      : `Fault code ${c.code ?? `SPN ${c.spn} FMI ${c.fmi}`}`),
  },
  reading: {
    kind: 'record',
    collection: 'readings',
    create: readingCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'reading', many: 'readings' },
    summary: (_a, c) => `Reading: ${cut(c.label, 30)} ${c.value ?? ''} ${c.unit ?? ''}`.trim(),
  },
  note: {
    kind: 'record',
    collection: 'notes',
    create: noteCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'note', many: 'notes' },
    summary: (_a, c) => `Note: ${cut(c.text)}`,
  },
  photo: {
    kind: 'record',
    collection: 'photos',
    create: photoCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'photo', many: 'photos' },
    summary: (_a, c) => `Photo${c.caption ? `: ${cut(c.caption, 30)}` : ''}`,
  },
  clockEvent: {
    kind: 'record',
    collection: 'clockEvents',
    create: clockEventCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'clock event', many: 'clock events' },
    summary: (_a, c) => (CLOCK_KINDS as readonly string[]).includes(String(c.kind)) ? CLOCK_WORDS[c.kind as ClockKind] : 'Clock',
  },
  partLine: {
    kind: 'record',
    collection: 'partLines',
    create: partLineCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'part line', many: 'part lines' },
    summary: (_a, c) => `Part ${c.partNumber ?? ''} × ${c.quantity ?? ''}`,
  },
  signOff: {
    kind: 'record',
    collection: 'signOffs',
    create: signOffCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'sign-off', many: 'sign-offs' },
    summary: (_a, c) => `Driver sign-off: ${cut(c.driverName, 30)}`,
  },
  approvalRequest: {
    kind: 'record',
    collection: 'approvalRequests',
    create: approvalRequestCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'approval request', many: 'approval requests' },
    summary: (_a, c) => {
      const total = typeof c.estimateCents === 'number' ? formatCents(c.estimateCents) : 'more'
      return `Asked the fleet for ${total}: ${cut(c.diagnosis)}`
    },
  },
  estimateSignature: {
    kind: 'record',
    collection: 'estimateSignatures',
    create: estimateSignatureCreateSchema,
    updatable: [],
    appendOnly: true,
    words: { one: 'signed estimate', many: 'signed estimates' },
    summary: (_a, c) => {
      const total = typeof c.amountCents === 'number' ? formatCents(c.amountCents) : 'the estimate'
      return `Driver signed the estimate of ${total}: ${cut(c.driverName, 30)}`
    },
  },
  conflictResolution: {
    kind: 'command',
    command: conflictResolutionSchema,
    appendOnly: true,
    words: { one: 'conflict settlement', many: 'conflict settlements' },
    summary: () => 'Conflict settled',
  },
} as const satisfies Record<string, EntityDef>

export type SyncEntityName = keyof typeof SYNC_ENTITIES
type Defs = typeof SYNC_ENTITIES
export type RecordEntityName = { [K in SyncEntityName]: Defs[K] extends { kind: 'record' } ? K : never }[SyncEntityName]
/** Entities an update op may change in place: the call and the records that are not append-only. */
export type UpdatableEntityName = { [K in SyncEntityName]: Defs[K] extends { update: object } ? K : never }[SyncEntityName]
/** A record's create as the schema answers it (what the server stores, before its own columns). */
export type RecordCreate<E extends RecordEntityName> = z.output<Defs[E]['create']>
/** Where a record's rows travel: the pull's `changes` key, the phone's bundle collection, the server's table. */
export type RecordCollection = Defs[RecordEntityName]['collection']

export const SYNC_ENTITY_NAMES = Object.keys(SYNC_ENTITIES) as [SyncEntityName, ...SyncEntityName[]]
export const RECORD_ENTITY_NAMES = SYNC_ENTITY_NAMES.filter(n => SYNC_ENTITIES[n].kind === 'record') as RecordEntityName[]

export function isSyncEntity(name: string): name is SyncEntityName {
  return Object.hasOwn(SYNC_ENTITIES, name)
}
export function isRecordEntity(name: string): name is RecordEntityName {
  return isSyncEntity(name) && SYNC_ENTITIES[name].kind === 'record'
}

export function syncEntity<N extends SyncEntityName>(name: N): Defs[N] {
  return SYNC_ENTITIES[name]
}

/** Record entity → collection, e.g. reading → readings. */
export const RECORD_COLLECTIONS = Object.fromEntries(RECORD_ENTITY_NAMES.map(n => [n, SYNC_ENTITIES[n].collection])) as {
  [K in RecordEntityName]: Defs[K]['collection']
}
/** Every collection of records under a call, in the registry's order. */
export const RECORD_COLLECTION_NAMES = RECORD_ENTITY_NAMES.map(n => SYNC_ENTITIES[n].collection) as RecordCollection[]

/**
 * Collections the server writes under a call and the pull hands out beside the device's own records:
 * the timeline, the conflicts and the fleet's answers to approval requests. The phone keeps them in the
 * call's bundle; it never writes them.
 */
export const SERVER_COLLECTION_NAMES = ['callEvents', 'conflicts', 'approvals'] as const
export type ServerCollection = (typeof SERVER_COLLECTION_NAMES)[number]

/** The op in one line of plain words (the sync panel, the journal). */
export function summarizeOp(op: { entity: string, action: OpAction, changes: Changes }): string {
  return isSyncEntity(op.entity) ? SYNC_ENTITIES[op.entity].summary(op.action, op.changes) : op.entity
}

/** The zod issues of an op's changes as one reason naming each field. */
export function changesReason(error: z.ZodError, entity: SyncEntityName): string {
  const word = SYNC_ENTITIES[entity].words.one
  return describeIssues(error, { root: 'changes', unknownKey: () => `not a field of a ${word} a device may change` })
}

export type CheckedOp
  = | { ok: true, kind: 'create', entity: RecordEntityName, data: Changes }
    | { ok: true, kind: 'update', entity: UpdatableEntityName, data: Changes }
    | { ok: true, kind: 'command', entity: 'conflictResolution', data: z.output<typeof conflictResolutionSchema>, hasValue: boolean }
    | { ok: false, reason: string }

/**
 * An op checked against its entity's schema: what the device runs before it queues an op (so it
 * cannot queue what the server would refuse for its shape) and the server's first stage.
 */
export function checkOp(op: { entity: string, action: string, entityId: string, changes: Changes }): CheckedOp {
  const { entity, action, changes } = op
  if (!isSyncEntity(entity)) return { ok: false, reason: `entity: unknown; expected one of ${SYNC_ENTITY_NAMES.join(', ')}` }
  if (action !== 'create' && action !== 'update') return { ok: false, reason: 'action: expected create or update' }
  const def: EntityDef = SYNC_ENTITIES[entity]
  if (def.kind === 'command') {
    const r = def.command.safeParse(changes)
    if (!r.success) return { ok: false, reason: changesReason(r.error, entity) }
    const data = r.data as z.output<typeof conflictResolutionSchema>
    return { ok: true, kind: 'command', entity: 'conflictResolution', data, hasValue: 'value' in changes }
  }
  if (action === 'update') {
    if (!('update' in def) || !def.update) return { ok: false, reason: `action: ${def.words.many} are append-only` }
    if (!Object.keys(changes).length) return { ok: false, reason: 'changes: nothing to change' }
    const r = def.update.safeParse(changes)
    if (!r.success) return { ok: false, reason: changesReason(r.error, entity) }
    return { ok: true, kind: 'update', entity: entity as UpdatableEntityName, data: r.data }
  }
  if (def.kind === 'call') return { ok: false, reason: 'action: calls are taken by dispatch, not created by sync' }
  // An `id` among the fields must be the op's; the schema leaves it out of the parsed record.
  if (changes.id !== undefined && changes.id !== op.entityId) return { ok: false, reason: 'id: differs from the op entityId' }
  const r = def.create.safeParse(changes)
  if (!r.success) return { ok: false, reason: changesReason(r.error, entity) }
  return { ok: true, kind: 'create', entity: entity as RecordEntityName, data: r.data }
}
