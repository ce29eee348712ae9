// The device's IndexedDB: one database with several object stores, so a local change, its outbox
// op and the next seq can be written in one transaction. idb-keyval's helpers work on each store
// through `deviceStore(name)`. Some mobile browsers close the connection while the app is
// suspended; every access reopens it and retries once when that happened.
import { promisifyRequest, type UseStore } from 'idb-keyval'

export const DEVICE_DB_NAME = 'wayside'
export const DEVICE_DB_VERSION = 1
export const DEVICE_STORES = ['meta', 'calls', 'library', 'outbox', 'photos', 'journal'] as const
export type DeviceStoreName = (typeof DEVICE_STORES)[number]

let dbPromise: Promise<IDBDatabase> | undefined
// Read-write transactions begun so far: a read started earlier is stale once this has moved.
let writes = 0

/** How many read-write transactions have begun (deviceRead.ts drops an early read after one). */
export function deviceWriteCount() {
  return writes
}

function openDb(): Promise<IDBDatabase> {
  if (!dbPromise) {
    const req = indexedDB.open(DEVICE_DB_NAME, DEVICE_DB_VERSION)
    req.onupgradeneeded = () => {
      for (const name of DEVICE_STORES) if (!req.result.objectStoreNames.contains(name)) req.result.createObjectStore(name)
    }
    dbPromise = promisifyRequest(req).then((db) => {
      db.onclose = () => { dbPromise = undefined }
      db.onversionchange = () => { db.close(); dbPromise = undefined }
      return db
    }, (err) => { dbPromise = undefined; throw err })
  }
  return dbPromise
}

function isClosedError(err: unknown) {
  return err instanceof DOMException && (err.name === 'InvalidStateError' || err.name === 'TransactionInactiveError')
}

// Listeners, not `oncomplete =`: idb-keyval's own helpers assign those properties and would
// replace ours on the same transaction.
function transactionDone(tx: IDBTransaction): Promise<void> {
  return new Promise((resolve, reject) => {
    tx.addEventListener('complete', () => resolve())
    tx.addEventListener('abort', () => reject(tx.error ?? new DOMException('Transaction aborted', 'AbortError')))
    tx.addEventListener('error', () => reject(tx.error))
  })
}

/** Runs `fn` in one transaction over `stores`; resolves when the transaction has committed. */
export async function deviceTx<T>(
  stores: DeviceStoreName[], mode: IDBTransactionMode, fn: (tx: IDBTransaction) => T | PromiseLike<T>,
): Promise<T> {
  for (let attempt = 0; ; attempt++) {
    try {
      const db = await openDb()
      const tx = db.transaction(stores, mode)
      if (mode === 'readwrite') writes++
      const done = transactionDone(tx)
      done.catch(() => {}) // observed below; avoids an unhandled rejection when fn throws first
      let result: T
      try { result = await fn(tx) }
      catch (err) {
        try { tx.abort() }
        catch { /* already finished */ }
        throw err
      }
      await done
      return result
    }
    catch (err) {
      if (attempt === 0 && isClosedError(err)) { dbPromise = undefined; continue }
      throw err
    }
  }
}

/** An idb-keyval custom store over one of the device's object stores. */
export function deviceStore(name: DeviceStoreName): UseStore {
  return (mode, callback) => deviceTx([name], mode, tx => callback(tx.objectStore(name)))
}

/** Closes the connection (tests use this to simulate the browser dropping it). */
export async function closeDeviceDb() {
  if (dbPromise) (await dbPromise).close()
  dbPromise = undefined
}
