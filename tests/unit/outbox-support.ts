// Helpers for the outbox tests: a fresh fake IndexedDB per test and a call pulled onto the device.
import 'fake-indexeddb/auto'
import { createPinia, setActivePinia } from 'pinia'
import { closeDeviceDb, DEVICE_DB_NAME } from '../../app/utils/deviceDb'
import { applyPull } from '../../app/utils/syncApply'
import type { PullAnswer } from '../../app/utils/syncWire'

export const CALL_ID = '11111111-1111-4111-8111-111111111111'
export const UNIT_ID = '22222222-2222-4222-8222-222222222222'
export const CUSTOMER_ID = '33333333-3333-4333-8333-333333333333'

export async function freshDevice() {
  await closeDeviceDb()
  await new Promise<void>((resolve, reject) => {
    const req = indexedDB.deleteDatabase(DEVICE_DB_NAME)
    req.onsuccess = () => resolve()
    req.onerror = () => reject(req.error)
  })
  setActivePinia(createPinia())
}

/** A new Pinia, as after a reload: the stores must re-read everything from IndexedDB. */
export async function reloadApp() {
  await closeDeviceDb()
  setActivePinia(createPinia())
}

export function pullAnswer(over: Partial<PullAnswer['changes']> = {}, extra: Partial<PullAnswer> = {}): PullAnswer {
  const empty = {
    calls: [], units: [], customers: [], faultCodes: [], readings: [], notes: [], photos: [], clockEvents: [], partLines: [], testRuns: [],
    signOffs: [], callEvents: [], conflicts: [],
  }
  return { cursor: 'c1', lastSeq: 0, changes: { ...empty, ...over }, conflicts: [], revokedCallIds: [], ...extra }
}

export function demoCall(over: Record<string, unknown> = {}) {
  return {
    id: CALL_ID, number: 41, status: 'assigned', customerId: CUSTOMER_ID, unitId: UNIT_ID, locationText: 'Route 8 shoulder',
    complaint: 'Derated', version: 3, storyCause: null, ...over,
  }
}

export async function seedCall(over: Record<string, unknown> = {}) {
  await applyPull(pullAnswer({
    calls: [demoCall(over)],
    units: [{ id: UNIT_ID, unitNumber: 'IR-114', customerId: CUSTOMER_ID }],
    customers: [{ id: CUSTOMER_ID, name: 'Ironwood Freight Lines' }],
  }))
}
