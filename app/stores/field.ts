// The mechanic's calls as kept on the phone. Every change goes to IndexedDB with its outbox op
// in one transaction (app/utils/fieldDb.ts) and shows at once as "waiting to sync"; the sync
// engine (useSync) carries the ops to the server later. Other screens (test cards, like-sensor
// checks) write through addRecord / updateRecord / updateCall and read through loadCall.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref } from 'vue'
import { describeFaultCode } from '#shared/utils/dtc'
import { isPauseMove, type CallStatus } from '#shared/utils/callStatus'
import { runningCalls } from '../utils/fieldClock'
import { readBundle, readBundles, readDeviceLists } from '../utils/deviceRead'
import type {
  CallBundle, CallRecord, CollectionRows, CustomerRecord, DeviceRow, LocalChange, OutboxEntry, RecordEntity, UnitRecord,
} from '../utils/fieldDb'
import { useOutboxStore } from './outbox'

// The write path (op checks and their schemas) loads on the first write, not with the screens that only read.
const writer = () => import('../utils/fieldDb')

export type AddableEntity = RecordEntity
export type UpdatableEntity = 'faultCode' | 'testRun'

/** A call with its records, as the phone screens show it. */
export interface CallView {
  call: CallRecord
  unit: UnitRecord | null
  customer: CustomerRecord | null
  /** Earlier calls on the same unit (the other calls of it on the phone), newest first, with their codes in words. */
  history: (CallRecord & { codes: string[] })[]
  faultCodes: CollectionRows['faultCodes'][]
  readings: CollectionRows['readings'][]
  notes: CollectionRows['notes'][]
  photos: CollectionRows['photos'][]
  clockEvents: CollectionRows['clockEvents'][]
  partLines: CollectionRows['partLines'][]
  testRuns: CollectionRows['testRuns'][]
  signOffs: CollectionRows['signOffs'][]
  callEvents: CollectionRows['callEvents'][]
  /** The mechanic's requests for more and the fleet's answers. */
  approvalRequests: CollectionRows['approvalRequests'][]
  approvals: CollectionRows['approvals'][]
  /** The estimates the driver signed before the work (card customers), oldest first. */
  estimateSignatures: CollectionRows['estimateSignatures'][]
  /** The mechanic's other calls on the phone with a running clock: starting on this one pauses them. */
  runningElsewhere: { id: string, number: number, status: string }[]
  /** Open conflicts on this call. */
  conflicts: CollectionRows['conflicts'][]
  /** Ids (call, records, conflicts) that an op still waiting on the device touches. */
  pendingIds: string[]
  /** Ids whose op the server refused, with its reason. */
  rejected: Record<string, string>
  revoked: boolean
}

function codeLabel(r: DeviceRow) {
  try {
    return describeFaultCode({ code: r.code as string | null, spn: r.spn as number | null, fmi: r.fmi as number | null }).label
  }
  catch { return String(r.code ?? `SPN ${r.spn} FMI ${r.fmi}`) }
}

const timeOf = (r: DeviceRow) => String(r.deviceAt ?? r.at ?? r.createdAt ?? '')
const byTime = (a: DeviceRow, b: DeviceRow) => timeOf(a).localeCompare(timeOf(b))

export function viewOf(b: CallBundle, others: readonly CallBundle[], outbox: readonly OutboxEntry[]): CallView {
  const list = <C extends keyof CallBundle['records']>(c: C): CollectionRows[C][] => Object.values(b.records[c] ?? {}).sort(byTime)
  const mine = outbox.filter(e => e.callId === b.id)
  const rejected: Record<string, string> = {}
  for (const e of mine) if (e.state === 'rejected') rejected[e.entityId] = e.reason ?? 'Refused by the server'
  const unitId = b.call.unitId
  const seen = new Set<string>([b.id])
  const history: CallView['history'] = []
  const earlier = others.filter(o => unitId && o.call.unitId === unitId)
    .map(o => ({ ...o.call, codes: Object.values(o.records.faultCodes ?? {}).map(codeLabel) }))
  for (const h of earlier) {
    if (seen.has(h.id)) continue
    seen.add(h.id)
    history.push(h)
  }
  history.sort((x, y) => String(y.receivedAt ?? '').localeCompare(String(x.receivedAt ?? '')))
  return {
    call: b.call, unit: b.unit, customer: b.customer, history,
    faultCodes: list('faultCodes'), readings: list('readings'), notes: list('notes'), photos: list('photos'),
    clockEvents: list('clockEvents'), partLines: list('partLines'), testRuns: list('testRuns'),
    signOffs: list('signOffs'), callEvents: list('callEvents'), approvalRequests: list('approvalRequests'), approvals: list('approvals'),
    estimateSignatures: list('estimateSignatures'),
    runningElsewhere: runningCalls(others.map(clocked), b.id),
    conflicts: list('conflicts').filter(c => (c.status ?? 'open') === 'open'),
    pendingIds: [...new Set(mine.map(e => e.entityId))],
    rejected,
    revoked: !!b.revoked,
  }
}

const timeMarks = (b: CallBundle) => Object.values(b.records.clockEvents ?? {}).map(e => ({ kind: String(e.kind), at: timeOf(e) }))
const clocked = (b: CallBundle) => ({
  id: b.id, number: Number(b.call.number), status: String(b.call.status), revoked: !!b.revoked, marks: timeMarks(b),
})

function pick(row: Record<string, unknown>, keys: string[]) {
  return Object.fromEntries(keys.map(k => [k, row[k] ?? null]))
}

export const useFieldStore = defineStore('field', () => {
  /** The call open on screen, refreshed after every write to it and after every sync. */
  const current = ref<CallView | null>(null)

  async function loadCall(callId: string): Promise<CallView | null> {
    const { bundles, outbox } = await readDeviceLists()
    const bundle = bundles.find(b => b.id === callId)
    const view = bundle ? viewOf(bundle, bundles.filter(o => o.id !== callId), outbox) : null
    current.value = view
    return view
  }

  async function afterWrite(callId: string) {
    await useOutboxStore().noteWrite()
    if (current.value?.call.id === callId) await loadCall(callId)
  }

  /** Adds an append-only record to a call; returns its id. */
  async function addRecord(entity: AddableEntity, record: Record<string, unknown> & { callId: string, id?: string }): Promise<string> {
    const { RECORD_COLLECTION, commitChanges } = await writer()
    if (!(entity in RECORD_COLLECTION)) throw new Error(`Unknown record kind ${entity}`)
    const { id: given, ...fields } = record
    const id = given ?? crypto.randomUUID()
    await commitChanges(record.callId, [createChange(RECORD_COLLECTION, entity, id, fields)])
    await afterWrite(record.callId)
    return id
  }

  /** Changes fields of a fault code or test run (clearing a code, adding steps to a run). */
  async function updateRecord(
    entity: UpdatableEntity, id: string, changes: Record<string, unknown>, base?: Record<string, unknown>,
  ): Promise<void> {
    const { RECORD_COLLECTION, commitChanges } = await writer()
    const bundle = (await readDeviceLists()).bundles.find(b => b.records[RECORD_COLLECTION[entity]]?.[id])
    if (!bundle) throw new Error('That record is not on the phone')
    const rec = bundle.records[RECORD_COLLECTION[entity]][id]!
    await commitChanges(bundle.id, [{
      entity, entityId: id, action: 'update', changes,
      base: base ?? pick(rec, Object.keys(changes)),
      baseVersion: typeof rec.version === 'number' ? rec.version : undefined,
      apply: (b, _at, checked) => {
        const r = b.records[RECORD_COLLECTION[entity]][id]
        if (r) Object.assign(r, checked)
      },
    }])
    await afterWrite(bundle.id)
  }

  /** Changes call fields (status, story, checklist, verification…); base is what the phone last had. */
  async function updateCall(callId: string, changes: Record<string, unknown>): Promise<void> {
    await writeCall(callId, changes, [])
  }

  /**
   * A call change and records that belong with it (a status step and its clock event) in one
   * transaction, so one never syncs without the other.
   */
  async function writeCall(
    callId: string, changes: Record<string, unknown>, records: { entity: AddableEntity, record: Record<string, unknown> }[],
  ) {
    const [{ RECORD_COLLECTION, commitChanges }, bundle] = await Promise.all([writer(), readBundle(callId)])
    if (!bundle) throw new Error('This call is not on the phone; open it once with signal first')
    await commitChanges(callId, callChanges(RECORD_COLLECTION, bundle, changes, records))
    await afterWrite(callId)
  }

  /**
   * Starts driving to (or working on) a call, first pausing the other calls whose clock still
   * runs, in one transaction: a `pause` clock event ends their travel or labor, and their status
   * goes back to assigned (en route or at the truck only) so the board shows them paused. The
   * server keeps their enRouteAt (statusTimes), which is what makes the board's paused state true;
   * going back to a paused call later is a plain "Start driving" again.
   */
  async function startCall(
    callId: string, changes: Record<string, unknown>, records: { entity: AddableEntity, record: Record<string, unknown> }[],
  ): Promise<number[]> {
    const [{ RECORD_COLLECTION, commitCallGroups }, all] = await Promise.all([writer(), readBundles()])
    const bundle = all.find(b => b.id === callId)
    if (!bundle) throw new Error('This call is not on the phone; open it once with signal first')
    const running = runningCalls(all.map(clocked), callId)
    const groups = running.map((r) => {
      const other = all.find(b => b.id === r.id)!
      const back = isPauseMove(r.status as CallStatus, 'assigned') ? { status: 'assigned' } : {}
      return { callId: r.id, list: callChanges(RECORD_COLLECTION, other, back, [{ entity: 'clockEvent', record: { kind: 'pause' } }]) }
    })
    await commitCallGroups([...groups, { callId, list: callChanges(RECORD_COLLECTION, bundle, changes, records) }])
    await afterWrite(callId)
    return running.map(r => r.number)
  }

  /**
   * A photo: its record op and its bytes (with their SHA-256) queued in one transaction. The
   * bytes go up on their own queue once the server applied the record.
   */
  async function addPhoto(
    callId: string, photo: { bytes: ArrayBuffer, contentType: string, caption?: string, thumb?: string },
  ): Promise<string> {
    const { RECORD_COLLECTION, commitChanges } = await writer()
    const id = crypto.randomUUID()
    const sha256 = await sha256Hex(photo.bytes)
    const fields: Record<string, unknown> = { callId, contentType: photo.contentType, sizeBytes: photo.bytes.byteLength, sha256 }
    if (photo.caption) fields.caption = photo.caption
    const change = createChange(RECORD_COLLECTION, 'photo', id, fields, photo.thumb ? { thumb: photo.thumb } : {})
    const { bytes, contentType } = photo
    change.photo = { id, callId, bytes, sha256, contentType, size: bytes.byteLength, opApplied: false, tries: 0 }
    await commitChanges(callId, [change])
    await afterWrite(callId)
    return id
  }

  /** Settles a conflict with the device's value, the server's, or one typed by the mechanic. */
  async function resolveConflict(callId: string, conflictId: string, choice: 'device' | 'server' | 'value', value?: unknown) {
    const changes: Record<string, unknown> = { conflictId, choice }
    if (choice === 'value') changes.value = value
    const { commitChanges } = await writer()
    await commitChanges(callId, [{
      entity: 'conflictResolution', entityId: conflictId, action: 'create', changes,
      apply: (b) => {
        const c = b.records.conflicts[conflictId]
        if (c) c.pendingChoice = choice
      },
    }])
    await afterWrite(callId)
  }

  /** Calls on the phone with how many of their changes wait to sync. */
  async function listCalls() {
    const { bundles, outbox, photos } = await readDeviceLists({ photos: true })
    return bundles.map(b => ({
      call: b.call, unit: b.unit, customer: b.customer, revoked: !!b.revoked,
      waiting: outbox.filter(e => e.callId === b.id && e.state === 'pending').length + photos.filter(p => p.callId === b.id).length,
      rejected: outbox.filter(e => e.callId === b.id && e.state === 'rejected').length,
    }))
  }

  return { current, loadCall, addRecord, addPhoto, updateRecord, updateCall, writeCall, startCall, resolveConflict, listCalls }
})

/** A call update (base: what the phone last had) and the records that go with it, as local changes. */
function callChanges(
  collections: Record<AddableEntity, keyof CallBundle['records']>, bundle: CallBundle, changes: Record<string, unknown>,
  records: { entity: AddableEntity, record: Record<string, unknown> }[],
): LocalChange[] {
  const list: LocalChange[] = []
  if (Object.keys(changes).length) {
    list.push({
      entity: 'call', entityId: bundle.id, action: 'update', changes,
      base: pick(bundle.call, Object.keys(changes)),
      baseVersion: typeof bundle.call.version === 'number' ? bundle.call.version : undefined,
      apply: (b, _at, checked) => { b.call = { ...b.call, ...checked } },
    })
  }
  for (const r of records) list.push(createChange(collections, r.entity, crypto.randomUUID(), { ...r.record, callId: bundle.id }))
  return list
}

/** A create op; `localOnly` fields (a thumbnail) stay on the phone and are not sent. */
function createChange(
  collections: Record<AddableEntity, keyof CallBundle['records']>, entity: AddableEntity, id: string, fields: Record<string, unknown>,
  localOnly: Record<string, unknown> = {},
): LocalChange {
  return {
    entity, entityId: id, action: 'create', changes: fields,
    apply: (b, at, checked) => { b.records[collections[entity]][id] = { ...checked, ...localOnly, id, deviceAt: at } },
  }
}

export async function sha256Hex(bytes: ArrayBuffer): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', bytes)
  return [...new Uint8Array(digest)].map(b => b.toString(16).padStart(2, '0')).join('')
}

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useFieldStore, import.meta.hot))
