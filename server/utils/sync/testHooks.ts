// Test-only pauses for the fault tests, which kill a spawned server mid-push. Active only when
// WAYSIDE_SYNC_TEST_PAUSE names the phase; never set it outside tests/api/sync-faults.test.ts.
export type SyncTestPhase = 'before-commit' | 'after-commit'

export async function syncTestPause(phase: SyncTestPhase) {
  if (process.env.WAYSIDE_SYNC_TEST_PAUSE !== phase) return
  const ms = Number(process.env.WAYSIDE_SYNC_TEST_PAUSE_MS ?? 60_000)
  console.log(`[sync-test] paused ${phase}`)
  await new Promise(resolve => setTimeout(resolve, ms))
}

let injected = 0
/** Makes the first N push transactions fail with a real serialization failure, to prove the retry. */
export function syncTestInjectSerializationFailure(): boolean {
  const n = Number(process.env.WAYSIDE_SYNC_TEST_SERIALIZATION_FAILURES ?? 0)
  if (injected >= n) return false
  injected++
  return true
}
