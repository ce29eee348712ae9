// What the phone's screens read from IndexedDB, apart from fieldDb.ts and syncApply.ts (writes, op
// checks, the pull's schemas), so a screen that only shows the calls loads no schema code. The
// lists a screen needs together (calls, outbox, photos waiting, journal) come from ONE read-only
// transaction: one moment, one trip to the database. A read started early (at app start, beside
// the session request) is handed to the first screen that asks, unless something was written since.
import { promisifyRequest } from 'idb-keyval'
import { deviceTx, deviceWriteCount, type DeviceStoreName } from './deviceDb'
import type { CallBundle, JournalEntry, OutboxEntry, QueuedPhoto } from './fieldDb'

export interface DeviceLists {
  bundles: CallBundle[]
  /** Ops waiting or refused, oldest first. */
  outbox: OutboxEntry[]
  photos: QueuedPhoto[]
  /** The newest journal entries first (only when asked for). */
  journal: JournalEntry[]
}

/** Which lists to read beside the calls and the outbox: the photos waiting (their bytes too) and the newest journal entries. */
export interface ListsWanted { photos?: boolean, journal?: number }

async function readAll({ photos = false, journal = 0 }: ListsWanted): Promise<DeviceLists> {
  const stores: DeviceStoreName[] = ['calls', 'outbox']
  if (photos) stores.push('photos')
  if (journal > 0) stores.push('journal')
  return deviceTx(stores, 'readonly', async (tx) => {
    const all = <T>(name: DeviceStoreName, want = true) =>
      (want ? promisifyRequest<T[]>(tx.objectStore(name).getAll()) : Promise.resolve([] as T[]))
    const [bundles, outbox, queued, entries] = await Promise.all([
      all<CallBundle>('calls'), all<OutboxEntry>('outbox'), all<QueuedPhoto>('photos', photos), all<JournalEntry>('journal', journal > 0),
    ])
    return {
      bundles, outbox: outbox.sort((x, y) => x.seq - y.seq), photos: queued,
      journal: entries.sort((x, y) => y.seq - x.seq).slice(0, journal),
    }
  })
}

let early: { writes: number, lists: Promise<DeviceLists> } | undefined

/** Starts reading the calls, outbox and photos now (at app start), for the first screen that asks. */
export function readDeviceListsEarly() {
  early = { writes: deviceWriteCount(), lists: readAll({ photos: true }) }
  early.lists.catch(() => {
    early = undefined
  })
}

/** The calls and the outbox (and what else is wanted) in one transaction. */
export async function readDeviceLists(wanted: ListsWanted = {}): Promise<DeviceLists> {
  const kept = early
  early = undefined
  if (kept && !wanted.journal && kept.writes === deviceWriteCount()) {
    const lists = await kept.lists.catch(() => null)
    if (lists) return lists
  }
  return readAll(wanted)
}

export async function readOutbox(): Promise<OutboxEntry[]> {
  return deviceTx(['outbox'], 'readonly', async (tx) => {
    const all = await promisifyRequest<OutboxEntry[]>(tx.objectStore('outbox').getAll())
    return all.sort((a, b) => a.seq - b.seq)
  })
}

export async function readJournal(limit = 100): Promise<JournalEntry[]> {
  const all = await deviceTx(['journal'], 'readonly', tx => promisifyRequest<JournalEntry[]>(tx.objectStore('journal').getAll()))
  return all.sort((a, b) => b.seq - a.seq).slice(0, limit)
}

export async function readBundle(callId: string): Promise<CallBundle | undefined> {
  return deviceTx(['calls'], 'readonly', tx => promisifyRequest<CallBundle | undefined>(tx.objectStore('calls').get(callId)))
}

export async function readBundles(): Promise<CallBundle[]> {
  return deviceTx(['calls'], 'readonly', tx => promisifyRequest<CallBundle[]>(tx.objectStore('calls').getAll()))
}

export async function readPhotoQueue(): Promise<QueuedPhoto[]> {
  return deviceTx(['photos'], 'readonly', tx => promisifyRequest<QueuedPhoto[]>(tx.objectStore('photos').getAll()))
}

export async function getMeta<T>(key: string): Promise<T | undefined> {
  return deviceTx(['meta'], 'readonly', tx => promisifyRequest<T | undefined>(tx.objectStore('meta').get(key)))
}
