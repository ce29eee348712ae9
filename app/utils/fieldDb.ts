// The mechanic's records on the device and the outbox of operations that carry them to the
// server. Every local change and its op (with the next seq) are written in ONE IndexedDB
// transaction, so a crash or a closed tab never leaves a change without its op or a gap in seq.
// See DESIGN.md, "Sync protocol", for the op shape.
import { promisifyRequest } from 'idb-keyval'
import { deviceTx } from './deviceDb'
import { checkOp, OpRefusedError } from './opCheck'
import {
  RECORD_COLLECTION_NAMES, RECORD_COLLECTIONS, SERVER_COLLECTION_NAMES, type RecordCollection, type RecordEntityName, type ServerCollection,
  type SyncEntityName,
} from '#shared/sync/entities'
import type {
  ApprovalRequestWire, ApprovalWire, CallEventWire, CallWire, ClockEventWire, ConflictWire, CustomerWire, DeviceRecord, FaultCodeWire,
  EstimateSignatureWire, NoteWire, PartLineWire, PhotoWire,
  ReadingWire, SignOffWire, TestRunWire, UnitWire,
} from '#shared/types/syncRows'

export const SCHEMA_VERSION = 1

/** A record the mechanic adds to a call (the registry's record entities). */
export type RecordEntity = RecordEntityName
/** What an op may name: the registry's entities. */
export type OpEntity = SyncEntityName
/** Any record on the device; each collection's own type is in CollectionRows. */
export type DeviceRow = DeviceRecord

export interface Op {
  opId: string
  clientId: string
  seq: number
  at: string
  schemaVersion: number
  entity: OpEntity
  entityId: string
  action: 'create' | 'update'
  baseVersion?: number
  changes: Record<string, unknown>
  base?: Record<string, unknown>
}

/** An op waiting on the device; `rejected` ones stay, with the reason, until edited or discarded. */
export interface OutboxEntry extends Op {
  callId: string
  state: 'pending' | 'rejected'
  reason?: string
  tries: number
}

export type OpStatus = 'applied' | 'duplicate' | 'conflict' | 'rejected'
export interface JournalEntry {
  seq: number
  opId: string
  entity: OpEntity
  entityId: string
  callId: string
  action: Op['action']
  at: string
  status: OpStatus | 'discarded'
  reason?: string
  doneAt: string
  /** The op in words, kept because the journal does not keep the op's data. */
  summary: string
}

/** Where a record entity lives in a call's bundle (and in a pull's `changes`): the registry's collection. */
export const RECORD_COLLECTION = RECORD_COLLECTIONS
/** A call's collections on the device: the registry's records, then what the server writes (timeline, conflicts, approvals). */
export type Collection = RecordCollection | ServerCollection
export const BUNDLE_COLLECTIONS: Collection[] = [...RECORD_COLLECTION_NAMES, ...SERVER_COLLECTION_NAMES]

/** The row type of each collection under a call, with the marks the phone keeps on some. */
export interface CollectionRows {
  readings: DeviceRecord<ReadingWire>
  faultCodes: DeviceRecord<FaultCodeWire>
  notes: DeviceRecord<NoteWire>
  /**
   * `thumb`: a small copy kept on the phone only; `uploadedAt`: the server confirmed the bytes;
   * `notAdded`: why the server kept the photo as a conflict instead (a billed call), its bytes not sent.
   */
  photos: DeviceRecord<PhotoWire & { thumb: string, uploadedAt: string, notAdded: string }>
  clockEvents: DeviceRecord<ClockEventWire>
  partLines: DeviceRecord<PartLineWire>
  testRuns: DeviceRecord<TestRunWire>
  signOffs: DeviceRecord<SignOffWire>
  approvalRequests: DeviceRecord<ApprovalRequestWire>
  estimateSignatures: DeviceRecord<EstimateSignatureWire>
  approvals: DeviceRecord<ApprovalWire>
  callEvents: DeviceRecord<CallEventWire>
  /** `pendingChoice`: settled on the phone, the settlement not yet sent. */
  conflicts: DeviceRecord<ConflictWire & { pendingChoice: 'device' | 'server' | 'value' }>
}
export type CallRecord = DeviceRecord<CallWire>
export type UnitRecord = DeviceRecord<UnitWire>
export type CustomerRecord = DeviceRecord<CustomerWire>

/** One call as the device keeps it: the call, its unit and customer, its records. */
export interface CallBundle {
  id: string
  call: CallRecord
  unit: UnitRecord | null
  customer: CustomerRecord | null
  records: { [C in Collection]: Record<string, CollectionRows[C]> }
  /** The call was taken away from this mechanic while work on it still waits to sync. */
  revoked?: boolean
}

export function emptyBundle(call: CallRecord): CallBundle {
  const records = Object.fromEntries(BUNDLE_COLLECTIONS.map(c => [c, {}])) as CallBundle['records']
  return { id: call.id, call, unit: null, customer: null, records }
}

const META_CLIENT = 'clientId'
const META_SEQ = 'seq'

/** This installed device's id, made once and kept in IndexedDB meta. */
export async function getClientId(): Promise<string> {
  return deviceTx(['meta'], 'readwrite', async (tx) => {
    const meta = tx.objectStore('meta')
    const have = await promisifyRequest<string | undefined>(meta.get(META_CLIENT))
    if (have) return have
    const id = crypto.randomUUID()
    meta.put(id, META_CLIENT)
    return id
  })
}

export async function setMeta(key: string, value: unknown): Promise<void> {
  await deviceTx(['meta'], 'readwrite', (tx) => {
    tx.objectStore('meta').put(value, key)
  })
}

export async function setLibrary(key: string, value: unknown): Promise<void> {
  await deviceTx(['library'], 'readwrite', (tx) => {
    tx.objectStore('library').put(value, key)
  })
}

/** What one local change does: the op to queue and how the call's bundle changes with it. */
export interface LocalChange {
  entity: OpEntity
  entityId: string
  action: Op['action']
  changes: Record<string, unknown>
  base?: Record<string, unknown>
  baseVersion?: number
  /** How the bundle changes; `changes` are the checked ones the op carries. */
  apply?: (bundle: CallBundle, at: string, changes: Record<string, unknown>) => void
  /** A photo's bytes, queued for upload in the same transaction as the op that creates it. */
  photo?: QueuedPhoto
}

/** Photo bytes waiting for upload; ArrayBuffer, since Blobs in IndexedDB fail on some phones. */
export interface QueuedPhoto {
  id: string
  callId: string
  bytes: ArrayBuffer
  sha256: string
  contentType: string
  size: number
  /** The server applied the op creating the photo; only then are the bytes sent. */
  opApplied: boolean
  tries: number
  lastError?: string
}

/**
 * Writes several changes to one call and their ops, with contiguous seqs, in one transaction.
 * Every op is checked against the protocol's schema first: one the server would refuse for its
 * shape throws OpRefusedError naming the field, and nothing is written. Returns the ops written.
 */
export async function commitChanges(callId: string, list: LocalChange[]): Promise<Op[]> {
  return commitCallGroups([{ callId, list }])
}

/**
 * Changes to several calls in one transaction, in the order given (pausing one call and starting
 * another: both land, or neither does).
 */
export async function commitCallGroups(groups: { callId: string, list: LocalChange[] }[]): Promise<Op[]> {
  const checked = groups.map(g => ({ callId: g.callId, list: g.list.map(c => checkedChange(c)) }))
  const clientId = await getClientId()
  return deviceTx(['meta', 'calls', 'outbox', 'photos'], 'readwrite', async (tx) => {
    const meta = tx.objectStore('meta')
    const callsStore = tx.objectStore('calls')
    const bundles = new Map<string, CallBundle>()
    for (const { callId } of checked) {
      const bundle = await promisifyRequest<CallBundle | undefined>(callsStore.get(callId))
      if (!bundle) throw new Error('This call is not on the phone; open it once with signal first')
      bundles.set(callId, bundle)
    }
    let seq = (await promisifyRequest<number | undefined>(meta.get(META_SEQ))) ?? 0
    const at = new Date().toISOString()
    const ops: Op[] = []
    for (const { callId, list } of checked) {
      const bundle = bundles.get(callId)!
      for (const c of list) {
        seq += 1
        const op: Op = {
          opId: crypto.randomUUID(), clientId, seq, at, schemaVersion: SCHEMA_VERSION,
          entity: c.entity, entityId: c.entityId, action: c.action, changes: c.changes,
        }
        if (c.base) op.base = c.base
        if (c.baseVersion !== undefined) op.baseVersion = c.baseVersion
        c.apply?.(bundle, at, c.changes)
        if (c.photo) tx.objectStore('photos').put(c.photo, c.photo.id)
        const entry: OutboxEntry = { ...op, callId, state: 'pending', tries: 0 }
        tx.objectStore('outbox').put(entry, seq)
        ops.push(op)
      }
    }
    meta.put(seq, META_SEQ)
    for (const [callId, bundle] of bundles) callsStore.put(bundle, callId)
    return ops
  })
}

function checkedChange(c: LocalChange): LocalChange {
  if (c.action === 'update' && !Object.keys(c.changes).length) throw new OpRefusedError({ _: 'Nothing to change' })
  return { ...c, changes: checkOp(c.entity, c.action, c.changes) }
}

/** Lays pending changes over a server row, oldest first, so the device shows its own edits. */
export function overlayPending(row: DeviceRow, ops: readonly Pick<Op, 'changes'>[]): DeviceRow {
  let out = row
  for (const op of ops) out = { ...out, ...op.changes }
  return out
}

/** Ops still waiting (or rejected), by the id of the record they touch. */
export function waitingByEntity(outbox: readonly OutboxEntry[]): Map<string, OutboxEntry[]> {
  const m = new Map<string, OutboxEntry[]>()
  for (const e of outbox) {
    const list = m.get(e.entityId) ?? []
    list.push(e)
    m.set(e.entityId, list)
  }
  return m
}

/**
 * Ties the device's records to the person signed in. Another person's calls never show: with
 * nothing waiting, the device is cleared for the new person (new client id, fresh pull); with
 * work still waiting, it stays untouched for its owner and 'foreign' is answered.
 */
export async function claimDevice(userId: string): Promise<'mine' | 'cleared' | 'foreign'> {
  return deviceTx(['meta', 'calls', 'library', 'outbox', 'photos', 'journal'], 'readwrite', async (tx) => {
    const meta = tx.objectStore('meta')
    const owner = await promisifyRequest<string | undefined>(meta.get('ownerId'))
    if (owner === userId) return 'mine'
    if (owner === undefined) {
      meta.put(userId, 'ownerId')
      return 'mine'
    }
    const waiting = await promisifyRequest<number>(tx.objectStore('outbox').count())
    const photos = await promisifyRequest<number>(tx.objectStore('photos').count())
    if (waiting + photos > 0) return 'foreign'
    for (const s of ['calls', 'library', 'journal'] as const) tx.objectStore(s).clear()
    for (const k of [META_CLIENT, META_SEQ, 'cursor', 'lastSyncAt', 'positionSentAt', 'stockFetchedAt']) meta.delete(k)
    meta.put(userId, 'ownerId')
    return 'cleared'
  })
}
