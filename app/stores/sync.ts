// The sync engine's one owner: its state (syncing, last sync, why it stopped, when it tries next,
// whether Wayside answered) and when a pass runs: on start, when the phone comes back online,
// when the app comes to the front, on a timer while online, soon after each local change, and on
// the Sync now button. One tab at a time holds the 'wayside-sync' lock; failures back off from
// 1 s to 5 min with jitter and honour Retry-After; 401 and 426 stop until the person acts. The
// pass itself is app/utils/syncClient.ts; what waits on the device is the outbox store.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref, watch } from 'vue'
import { nextRetryDelay } from '../utils/backoff'
import { getMeta } from '../utils/deviceRead'
import type { SyncFailure, SyncFetch, SyncPosition } from '../utils/syncClient'
import { useOutboxStore } from './outbox'

export type SyncOutcome = { ok: true, changedCalls: string[] } | { ok: false, kind: SyncFailure, message: string, retryAfterMs?: number }

const PERIOD_MS = 60_000
const AFTER_WRITE_MS = 1500
// The pass itself (push, pull, their schemas) loads when the first pass runs, after the screen has painted.
const engine = () => import('../utils/syncClient')

// usePrefsStore is Nuxt's auto-import (the prefs store needs the Nuxt app), read only when a pass runs in the app.
async function lastPosition(consent: string | undefined): Promise<SyncPosition | undefined> {
  if (consent !== 'yes' || !navigator.geolocation) return undefined
  const pos = await new Promise<GeolocationPosition | null>((resolve) => {
    const options = { enableHighAccuracy: false, timeout: 8000, maximumAge: 10 * 60_000 }
    navigator.geolocation.getCurrentPosition(resolve, () => resolve(null), options)
  })
  if (!pos) return undefined
  const at = new Date(pos.timestamp).toISOString()
  // Sent once per fix: an old fix already sent adds nothing.
  if ((await getMeta<string>('positionSentAt')) === at) return undefined
  return { lat: pos.coords.latitude, lon: pos.coords.longitude, at }
}

export const useSyncStore = defineStore('sync', () => {
  const outbox = useOutboxStore()
  const syncing = ref(false)
  const lastSyncAt = ref<string | null>(null)
  const lastAttemptAt = ref<string | null>(null)
  const lastError = ref<string | null>(null)
  /** Why sync is stopped until the person acts: sign in again, update the app, or another person's work waits here. */
  const paused = ref<'signin' | 'update' | 'owner' | null>(null)
  const nextAttemptAt = ref<number | null>(null)
  /** Bumped after a pull changed calls, so open screens re-read them. */
  const pulls = ref(0)
  /** Bumped after a pull brought test cards, so the library re-reads the device. */
  const libraryPulls = ref(0)
  /** Whether the last request reached Wayside: false after a network failure, null before any (or after `online`). */
  const reachable = ref<boolean | null>(null)
  /** A word for the person about the last thing they asked (Sync now with no signal). */
  const notice = ref<string | null>(null)

  // The scheduler's own bookkeeping: not for screens, so not reactive.
  let started = false
  let userId: string | undefined
  let attempt = 0
  let timer: ReturnType<typeof setTimeout> | undefined
  let running: Promise<SyncOutcome | undefined> | undefined
  let again = false
  const stops: (() => void)[] = []

  /** Reads what the device remembers of the last sync (after a reload). */
  async function refresh() {
    lastSyncAt.value = (await getMeta<string>('lastSyncAt')) ?? null
  }

  /** One whole pass: push, photos, pull. Never throws; says what happened. */
  async function runOnce(opts: { fetch?: SyncFetch, position?: SyncPosition } = {}): Promise<SyncOutcome> {
    const doFetch = opts.fetch ?? ((url, init) => globalThis.fetch(url, init))
    const loaded = await engine().catch((err: unknown) => err instanceof Error ? err : new Error(String(err)))
    // The app's files could not be read (a new version replaced them): like no signal, tried again later.
    if (loaded instanceof Error) return { ok: false, kind: 'offline', message: loaded.message }
    const { SyncStop, syncPass } = loaded
    syncing.value = true
    lastAttemptAt.value = new Date().toISOString()
    try {
      const { changedCalls, cards } = await syncPass(doFetch, opts.position)
      lastError.value = null
      notice.value = null
      reachable.value = true
      paused.value = null
      if (changedCalls.length) pulls.value++
      if (cards) libraryPulls.value++
      return { ok: true, changedCalls }
    }
    catch (err) {
      const stop = err instanceof SyncStop ? err : new SyncStop('server', err instanceof Error ? err.message : String(err))
      lastError.value = stop.message
      reachable.value = stop.kind !== 'offline'
      if (stop.kind === 'signin' || stop.kind === 'update') paused.value = stop.kind
      return { ok: false, kind: stop.kind, message: stop.message, retryAfterMs: stop.retryAfterMs }
    }
    finally {
      syncing.value = false
      await Promise.all([refresh(), outbox.refresh()]).catch(() => {})
    }
  }

  function schedule(ms: number) {
    if (timer) clearTimeout(timer)
    nextAttemptAt.value = Date.now() + ms
    timer = setTimeout(() => void run(), ms)
  }

  async function pass(): Promise<SyncOutcome> {
    const position = await lastPosition(usePrefsStore().positionConsent).catch(() => undefined)
    const work = () => runOnce({ position })
    return navigator.locks?.request ? navigator.locks.request('wayside-sync', work) : work()
  }

  /** Runs a pass now, or once more after the one under way. */
  async function run(): Promise<SyncOutcome | undefined> {
    if (!import.meta.client) return undefined
    if (running) {
      again = true
      return running
    }
    if (paused.value) return undefined
    // No signal: nothing to try; the `online` event starts the next pass.
    if (!navigator.onLine) return undefined
    if (timer) clearTimeout(timer)
    running = (async () => {
      const outcome = await pass()
      if (outcome.ok) {
        attempt = 0
        schedule(PERIOD_MS)
      }
      else if (outcome.kind !== 'signin' && outcome.kind !== 'update') {
        schedule(nextRetryDelay(attempt++, Math.random(), outcome.retryAfterMs))
        again = false
      }
      else nextAttemptAt.value = null
      return outcome
    })()
    try {
      return await running
    }
    finally {
      running = undefined
      if (again) {
        again = false
        void run()
      }
    }
  }

  /** The Sync now button: no waiting for the backoff, and a new try after a sign-in. */
  function syncNow() {
    attempt = 0
    if (import.meta.client && !navigator.onLine) {
      notice.value = 'No signal, so nothing can be sent now. Your work stays on this phone and goes out by itself when signal returns.'
      return Promise.resolve(undefined)
    }
    notice.value = null
    if (paused.value === 'signin' || paused.value === 'update') paused.value = null
    return run()
  }

  /** Who the engine syncs for; a sign-in as someone else (without a reload) claims the device again. */
  async function claim(id: string) {
    userId = id
    const { claimDevice } = await import('../utils/fieldDb')
    if ((await claimDevice(id)) === 'foreign') {
      paused.value = 'owner'
      lastError.value = 'Changes made by another person wait on this phone. They sign in here to send them first.'
    }
    else if (paused.value === 'owner' || paused.value === 'signin') {
      paused.value = null
      lastError.value = null
    }
    await Promise.all([refresh(), outbox.refresh()])
  }

  async function start(id: string) {
    if (!import.meta.client) return
    if (started) {
      // Back from the sign-in page within the same app: pick up where the 401 stopped.
      if (userId !== id || paused.value === 'signin') {
        await claim(id)
        attempt = 0
        void run()
      }
      return
    }
    started = true
    await claim(id)
    const onOnline = () => {
      attempt = 0
      reachable.value = null
      notice.value = null
      void run()
    }
    const onVisible = () => {
      if (document.visibilityState !== 'visible') return
      if (!nextAttemptAt.value || nextAttemptAt.value <= Date.now() || attempt === 0) void run()
    }
    window.addEventListener('online', onOnline)
    document.addEventListener('visibilitychange', onVisible)
    let debounce: ReturnType<typeof setTimeout> | undefined
    const stopWatch = watch(() => outbox.writes, () => {
      if (debounce) clearTimeout(debounce)
      debounce = setTimeout(() => {
        if (attempt === 0) void run()
      }, AFTER_WRITE_MS)
    })
    stops.push(
      () => window.removeEventListener('online', onOnline),
      () => document.removeEventListener('visibilitychange', onVisible),
      stopWatch,
    )
    void run()
  }

  /** Nothing syncs for a person who signed out. */
  function stop() {
    for (const s of stops.splice(0)) s()
    if (timer) clearTimeout(timer)
    started = false
  }

  return {
    syncing, lastSyncAt, lastAttemptAt, lastError, paused, nextAttemptAt, pulls, libraryPulls, reachable, notice,
    refresh, runOnce, run, syncNow, start, stop,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useSyncStore, import.meta.hot))
