// Applying the server's answers to the device: push results take ops out of the outbox (only
// for applied, duplicate or conflict), pull changes replace local copies unless an op still
// waiting on the device touches them.
import { promisifyRequest } from 'idb-keyval'
import { deviceTx } from './deviceDb'
import {
  BUNDLE_COLLECTIONS, RECORD_COLLECTION, emptyBundle, overlayPending, waitingByEntity,
  type CallBundle, type Collection, type DeviceRow, type JournalEntry, type OutboxEntry, type QueuedPhoto, type RecordEntity,
} from './fieldDb'
import { opSummary } from './opSummary'
import { cardDefinitionSchema, type TestCardView } from '#shared/schemas/testCards'
import { ratesSchema } from '#shared/schemas/rates'
import { z } from 'zod'
import { CARD_LIST_KEY, cardKey, type LibraryList } from './libraryKeys'
import type { PullAnswer, PushResult } from './syncWire'

const JOURNAL_KEEP = 300

/** A rates row as the pull carries it: the admin's rates plus its id and when it took effect. */
const ratesRowSchema = ratesSchema.extend({ id: z.string(), effectiveFrom: z.string() })
export type PulledRates = z.infer<typeof ratesRowSchema>

function journalOf(e: OutboxEntry, status: JournalEntry['status'], reason?: string | null): JournalEntry {
  const j: JournalEntry = {
    seq: e.seq, opId: e.opId, entity: e.entity, entityId: e.entityId, callId: e.callId, action: e.action, at: e.at,
    status, doneAt: new Date().toISOString(), summary: opSummary(e),
  }
  if (reason) j.reason = reason
  return j
}

async function trimJournal(store: IDBObjectStore) {
  const keys = (await promisifyRequest<IDBValidKey[]>(store.getAllKeys())) as number[]
  if (keys.length <= JOURNAL_KEEP) return
  keys.sort((a, b) => a - b)
  for (const k of keys.slice(0, keys.length - JOURNAL_KEEP)) store.delete(k)
}

/**
 * A photo's record was answered. Applied: its bytes may go up now. Kept as a conflict (the call was
 * billed): the server has no photo row to take bytes, so the upload is settled with the conflict,
 * never retried; the record on the phone says why, the conflict waits for the office.
 */
async function photoOpAnswered(tx: IDBTransaction, e: OutboxEntry, status: string, reason?: string | null) {
  const photos = tx.objectStore('photos')
  const p = await promisifyRequest<QueuedPhoto | undefined>(photos.get(e.entityId))
  if (status !== 'conflict') {
    if (p) photos.put({ ...p, opApplied: true }, p.id)
    return
  }
  if (p) photos.delete(p.id)
  const calls = tx.objectStore('calls')
  const b = await promisifyRequest<CallBundle | undefined>(calls.get(e.callId))
  const rec = b?.records.photos?.[e.entityId]
  if (b && rec) {
    rec.notAdded = reason ?? 'The call was billed; the office keeps the photo as a change to settle'
    calls.put(b, b.id)
  }
}

/** Records what the server said about each sent op. Returns how many of them it answered. */
export async function applyPushResults(sent: readonly OutboxEntry[], answer: PushResult): Promise<number> {
  const byOp = new Map(sent.map(e => [e.opId, e]))
  return deviceTx(['outbox', 'journal', 'photos', 'calls'], 'readwrite', async (tx) => {
    const outbox = tx.objectStore('outbox')
    const journal = tx.objectStore('journal')
    let answered = 0
    for (const r of answer.results) {
      const e = byOp.get(r.opId)
      if (!e) continue
      answered++
      if (r.status === 'rejected') {
        const reason = r.reason ?? 'Refused by the server'
        outbox.put({ ...e, state: 'rejected', reason, tries: e.tries + 1 } satisfies OutboxEntry, e.seq)
        journal.put(journalOf(e, 'rejected', r.reason), e.seq)
        continue
      }
      outbox.delete(e.seq)
      journal.put(journalOf(e, r.status, r.reason), e.seq)
      if (e.entity === 'photo' && e.action === 'create') await photoOpAnswered(tx, e, r.status, r.reason)
    }
    // Ops the answer did not mention stay pending, counted as one more try.
    const named = new Set(answer.results.map(r => r.opId))
    for (const e of sent) if (!named.has(e.opId)) outbox.put({ ...e, tries: e.tries + 1 }, e.seq)
    await trimJournal(journal)
    return answered
  })
}

/**
 * After a 409 the server expects `expectedSeq` next. Ops below it are already stored there (their
 * answer was lost): they leave the outbox as duplicates. If the outbox starts above it (a gap),
 * the waiting ops, none of which the server has, are numbered on from `expectedSeq`.
 */
export async function realignSeq(expectedSeq: number): Promise<void> {
  await deviceTx(['outbox', 'journal', 'meta', 'photos'], 'readwrite', async (tx) => {
    const outbox = tx.objectStore('outbox')
    const all = (await promisifyRequest<OutboxEntry[]>(outbox.getAll())).sort((a, b) => a.seq - b.seq)
    const waiting = all.filter(e => e.state === 'pending')
    for (const e of waiting.filter(x => x.seq < expectedSeq)) {
      outbox.delete(e.seq)
      tx.objectStore('journal').put(journalOf(e, 'duplicate', 'Already stored on the server'), e.seq)
      if (e.entity === 'photo' && e.action === 'create') {
        const p = await promisifyRequest<QueuedPhoto | undefined>(tx.objectStore('photos').get(e.entityId))
        if (p) tx.objectStore('photos').put({ ...p, opApplied: true }, p.id)
      }
    }
    const rest = waiting.filter(x => x.seq >= expectedSeq)
    if (rest.length && rest[0]!.seq > expectedSeq) {
      for (const e of rest) outbox.delete(e.seq)
      let seq = expectedSeq - 1
      for (const e of rest) {
        seq += 1
        outbox.put({ ...e, seq }, seq)
      }
      // Read in this transaction, so an op written meanwhile by another tab is renumbered too.
      tx.objectStore('meta').put(seq, 'seq')
    }
  })
}

/** Drops a refused op; a refused create also takes its local record (and photo bytes) away. */
export async function discardRejected(seq: number): Promise<void> {
  await deviceTx(['outbox', 'journal', 'calls', 'photos'], 'readwrite', async (tx) => {
    const e = await promisifyRequest<OutboxEntry | undefined>(tx.objectStore('outbox').get(seq))
    if (!e || e.state !== 'rejected') throw new Error('Only a change the server refused can be discarded')
    tx.objectStore('outbox').delete(seq)
    tx.objectStore('journal').put(journalOf(e, 'discarded', e.reason), seq)
    const calls = tx.objectStore('calls')
    const b = await promisifyRequest<CallBundle | undefined>(calls.get(e.callId))
    if (b && e.action === 'create' && e.entity in RECORD_COLLECTION) {
      Reflect.deleteProperty(b.records[RECORD_COLLECTION[e.entity as RecordEntity]], e.entityId)
      calls.put(b, b.id)
    }
    else if (b && e.action === 'update' && e.base) {
      const target = e.entity === 'call' ? b.call : b.records[RECORD_COLLECTION[e.entity as RecordEntity]]?.[e.entityId]
      if (target) Object.assign(target, e.base)
      calls.put(b, b.id)
    }
    if (e.entity === 'photo') tx.objectStore('photos').delete(e.entityId)
  })
}

/** The server confirmed these bytes: the device's copy goes, the record shows it as uploaded. */
export async function photoConfirmed(id: string, sha256: string): Promise<void> {
  await deviceTx(['photos', 'calls'], 'readwrite', async (tx) => {
    const p = await promisifyRequest<QueuedPhoto | undefined>(tx.objectStore('photos').get(id))
    if (!p || p.sha256.toLowerCase() !== sha256.toLowerCase()) return
    tx.objectStore('photos').delete(id)
    const calls = tx.objectStore('calls')
    const b = await promisifyRequest<CallBundle | undefined>(calls.get(p.callId))
    const rec = b?.records.photos[id]
    if (b && rec) {
      rec.uploadedAt = rec.uploadedAt ?? new Date().toISOString()
      calls.put(b, b.id)
    }
  })
}

export async function photoFailed(id: string, error: string): Promise<void> {
  await deviceTx(['photos'], 'readwrite', async (tx) => {
    const p = await promisifyRequest<QueuedPhoto | undefined>(tx.objectStore('photos').get(id))
    if (p) tx.objectStore('photos').put({ ...p, tries: p.tries + 1, lastError: error }, id)
  })
}

type Library = { units?: Record<string, DeviceRow>, customers?: Record<string, DeviceRow> }

/** Applies one pull answer; returns the ids of calls that changed. */
export async function applyPull(answer: PullAnswer): Promise<string[]> {
  return deviceTx(['calls', 'library', 'outbox', 'meta'], 'readwrite', async (tx) => {
    const callsStore = tx.objectStore('calls')
    const lib = tx.objectStore('library')
    const waiting = waitingByEntity(await promisifyRequest<OutboxEntry[]>(tx.objectStore('outbox').getAll()))
    const ops = (id: string) => (waiting.get(id) ?? []).sort((a, b) => a.seq - b.seq)
    const bundles = new Map((await promisifyRequest<CallBundle[]>(callsStore.getAll())).map(b => [b.id, b]))
    const changed = new Set<string>()
    const ch = answer.changes

    const lookups: Library = {}
    for (const key of ['units', 'customers'] as const) {
      const map = (await promisifyRequest<Record<string, DeviceRow> | undefined>(lib.get(key))) ?? {}
      for (const r of ch[key]) map[r.id] = r
      if (ch[key].length) lib.put(map, key)
      lookups[key] = map
    }
    for (const row of ch.calls) {
      const b = bundles.get(row.id) ?? emptyBundle(row)
      b.call = overlayPending(row, ops(row.id).filter(o => o.entity === 'call'))
      delete b.revoked
      bundles.set(row.id, b)
      changed.add(row.id)
    }
    const upsert = (coll: Collection, row: DeviceRow) => {
      const callId = String(row.callId ?? '')
      const b = bundles.get(callId)
      if (!b) return
      b.records[coll] ??= {}
      const mine = ops(row.id).filter(o => o.entity !== 'call')
      const local = b.records[coll][row.id]
      b.records[coll][row.id] = mine.length ? overlayPending({ ...local, ...row }, mine) : row
      changed.add(callId)
    }
    for (const coll of BUNDLE_COLLECTIONS) for (const row of (ch[coll] ?? []) as DeviceRow[]) upsert(coll, row)
    for (const row of answer.conflicts) upsert('conflicts', row)
    // A change answered `conflict` left the server's value in place without touching its row,
    // so the row does not come again: take the server's value from the new conflict instead.
    const pulledCalls = new Set(ch.calls.map(c => c.id))
    for (const c of ch.conflicts) {
      const b = bundles.get(String(c.callId ?? ''))
      const field = String(c.field ?? '')
      if (!b || (c.status ?? 'open') !== 'open' || !field) continue
      const touched = (id: string) => ops(id).some(o => field in o.changes)
      if (c.entity === 'call' && !pulledCalls.has(b.id) && !touched(b.id)) b.call = { ...b.call, [field]: c.serverValue }
      else if (c.entity !== 'call' && !touched(String(c.entityId))) {
        const coll = RECORD_COLLECTION[c.entity as RecordEntity]
        const rec = coll ? b.records[coll]?.[String(c.entityId)] : undefined
        if (rec) rec[field] = c.serverValue
      }
      changed.add(b.id)
    }

    for (const b of bundles.values()) {
      const unit = b.call.unitId ? lookups.units?.[String(b.call.unitId)] : undefined
      const customer = lookups.customers?.[String(b.call.customerId)]
      if (unit && unit !== b.unit) {
        b.unit = unit
        changed.add(b.id)
      }
      if (customer && customer !== b.customer) {
        b.customer = customer
        changed.add(b.id)
      }
    }
    for (const id of answer.revokedCallIds) {
      const b = bundles.get(id)
      if (!b) continue
      const stillWaiting = [...waiting.values()].some(list => list.some(e => e.callId === id))
      if (stillWaiting) {
        b.revoked = true
        changed.add(id)
      }
      else {
        callsStore.delete(id)
        bundles.delete(id)
        changed.delete(id)
      }
    }
    for (const id of changed) {
      const b = bundles.get(id)
      if (b) callsStore.put(b, id)
    }

    await storeCards(lib, ch.testCards ?? [], (await promisifyRequest<unknown>(tx.objectStore('meta').get('cursor'))) === undefined)
    const rateRows = ch.rates
    if (rateRows.length) {
      const rates = (await promisifyRequest<Record<string, DeviceRow> | undefined>(lib.get('rates'))) ?? {}
      for (const r of rateRows) rates[r.id] = r
      lib.put(rates, 'rates')
    }
    const meta = tx.objectStore('meta')
    meta.put(answer.cursor, 'cursor')
    return [...changed]
  })
}

/**
 * The card library as the pull brings it: each card at its current version is kept under
 * `card:<id>@<version>` (a run keeps the version it started with) and listed under `cards`;
 * a turned-off card leaves the list. A first pull carries the whole library and replaces the list.
 */
async function storeCards(lib: IDBObjectStore, pulled: readonly Record<string, unknown>[], first: boolean) {
  if (!pulled.length && !first) return
  const kept = first ? undefined : await promisifyRequest<LibraryList | undefined>(lib.get(CARD_LIST_KEY))
  const list = new Map((kept?.items ?? []).map(c => [c.id, c]))
  for (const row of pulled) {
    const card = cardOf(row)
    if (!card) continue
    if (!card.active) {
      list.delete(card.id)
      continue
    }
    list.set(card.id, card)
    lib.put(card, cardKey(card.id, card.version))
  }
  const items = [...list.values()].sort((a, b) => a.title.localeCompare(b.title))
  lib.put({ items, fetchedAt: new Date().toISOString() } satisfies LibraryList, CARD_LIST_KEY)
}

/** A pulled card as the runner reads it; one whose definition fails the card schema is left out. */
function cardOf(row: Record<string, unknown>): TestCardView | undefined {
  const id = typeof row.id === 'string' ? row.id : undefined
  const version = Number(row.currentVersion ?? row.version)
  if (!id || !Number.isInteger(version)) return undefined
  if (row.active === false) return { id, active: false } as TestCardView
  const definition = cardDefinitionSchema.safeParse(row.definition)
  if (!definition.success) return undefined
  return { ...(row as unknown as TestCardView), version, currentVersion: version, definition: definition.data }
}

/** The rates in force as the last sync brought them (the newest by when they took effect), for estimates on the phone. */
export async function readRates(): Promise<PulledRates | undefined> {
  const all = Object.values((await readLibrary<Record<string, unknown>>('rates')) ?? {})
  const rows = all.flatMap((r) => {
    const p = ratesRowSchema.safeParse(r)
    return p.success ? [p.data] : []
  })
  return rows.sort((a, b) => b.effectiveFrom.localeCompare(a.effectiveFrom))[0]
}

/** One entry of the device's library (test cards, rates, units, customers, truck stock). */
export async function readLibrary<T = unknown>(key: string): Promise<T | undefined> {
  return deviceTx(['library'], 'readonly', tx => promisifyRequest<T | undefined>(tx.objectStore('library').get(key)))
}
