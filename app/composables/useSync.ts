// When the phone syncs: on start, when it comes back online, when the app comes to the front,
// on a timer while online, soon after each local change, and on the Sync now button. One tab at a
// time holds the 'wayside-sync' lock; failures back off from 1 s to 5 min with jitter and honour
// Retry-After; 401 and 426 stop until the person acts. The pass itself is useOutboxStore().runOnce.
import { watch } from 'vue'
import { nextRetryDelay } from '../utils/backoff'
import { claimDevice, getMeta } from '../utils/fieldDb'
import { useOutboxStore, type SyncOutcome, type SyncPosition } from '../stores/outbox'

const PERIOD_MS = 60_000
const AFTER_WRITE_MS = 1500

interface Engine {
  started: boolean
  userId?: string
  attempt: number
  timer?: ReturnType<typeof setTimeout>
  running?: Promise<SyncOutcome | undefined>
  again: boolean
  stops: (() => void)[]
}
// One engine per Pinia (per app); keyed by the store so nothing is shared across server requests.
const engines = new WeakMap<object, Engine>()

async function lastPosition(consent: string | undefined): Promise<SyncPosition | undefined> {
  if (consent !== 'yes' || !navigator.geolocation) return undefined
  const pos = await new Promise<GeolocationPosition | null>((resolve) => {
    navigator.geolocation.getCurrentPosition(resolve, () => resolve(null), { enableHighAccuracy: false, timeout: 8000, maximumAge: 10 * 60_000 })
  })
  if (!pos) return undefined
  const at = new Date(pos.timestamp).toISOString()
  // Sent once per fix: an old fix already sent adds nothing.
  if ((await getMeta<string>('positionSentAt')) === at) return undefined
  return { lat: pos.coords.latitude, lon: pos.coords.longitude, at }
}

export function useSync() {
  const outbox = useOutboxStore()
  const prefs = usePrefsStore()
  let engine = engines.get(outbox)
  if (!engine) { engine = { started: false, attempt: 0, again: false, stops: [] }; engines.set(outbox, engine) }
  const e = engine

  function schedule(ms: number) {
    if (e.timer) clearTimeout(e.timer)
    outbox.nextAttemptAt = Date.now() + ms
    e.timer = setTimeout(() => { void run() }, ms)
  }

  async function pass(): Promise<SyncOutcome> {
    const position = await lastPosition(prefs.positionConsent).catch(() => undefined)
    const work = () => outbox.runOnce({ position })
    return navigator.locks?.request ? navigator.locks.request('wayside-sync', work) : work()
  }

  /** Runs a pass now, or once more after the one under way. */
  async function run(): Promise<SyncOutcome | undefined> {
    if (!import.meta.client) return undefined
    if (e.running) { e.again = true; return e.running }
    if (outbox.paused) return undefined
    // No signal: nothing to try; the `online` event starts the next pass.
    if (!navigator.onLine) return undefined
    if (e.timer) clearTimeout(e.timer)
    e.running = (async () => {
      const outcome = await pass()
      if (outcome.ok) {
        e.attempt = 0
        schedule(PERIOD_MS)
      }
      else if (outcome.kind !== 'signin' && outcome.kind !== 'update') {
        schedule(nextRetryDelay(e.attempt++, Math.random(), outcome.retryAfterMs))
        e.again = false
      }
      else outbox.nextAttemptAt = null
      return outcome
    })()
    try { return await e.running }
    finally {
      e.running = undefined
      if (e.again) { e.again = false; void run() }
    }
  }

  /** The Sync now button: no waiting for the backoff, and a new try after a sign-in. */
  function syncNow() {
    e.attempt = 0
    if (import.meta.client && !navigator.onLine) {
      outbox.notice = 'No signal, so nothing can be sent now. Your work stays on this phone and goes out by itself when signal returns.'
      return Promise.resolve(undefined)
    }
    outbox.notice = null
    if (outbox.paused === 'signin' || outbox.paused === 'update') outbox.paused = null
    return run()
  }

  /** Who the engine syncs for; a sign-in as someone else (without a reload) claims the device again. */
  async function claim(userId: string) {
    e.userId = userId
    if ((await claimDevice(userId)) === 'foreign') {
      outbox.paused = 'owner'
      outbox.lastError = 'Changes made by another person wait on this phone. They sign in here to send them first.'
    }
    else if (outbox.paused === 'owner' || outbox.paused === 'signin') { outbox.paused = null; outbox.lastError = null }
    await outbox.refresh()
  }

  async function start(userId: string) {
    if (!import.meta.client) return
    if (e.started) {
      // Back from the sign-in page within the same app: pick up where the 401 stopped.
      if (e.userId !== userId || outbox.paused === 'signin') { await claim(userId); e.attempt = 0; void run() }
      return
    }
    e.started = true
    await claim(userId)
    const onOnline = () => { e.attempt = 0; outbox.reachable = null; outbox.notice = null; void run() }
    const onVisible = () => {
      if (document.visibilityState !== 'visible') return
      if (!outbox.nextAttemptAt || outbox.nextAttemptAt <= Date.now() || e.attempt === 0) void run()
    }
    window.addEventListener('online', onOnline)
    document.addEventListener('visibilitychange', onVisible)
    let debounce: ReturnType<typeof setTimeout> | undefined
    const stopWatch = watch(() => outbox.writes, () => {
      if (debounce) clearTimeout(debounce)
      debounce = setTimeout(() => { if (e.attempt === 0) void run() }, AFTER_WRITE_MS)
    })
    e.stops.push(() => window.removeEventListener('online', onOnline), () => document.removeEventListener('visibilitychange', onVisible), stopWatch)
    void run()
  }

  function stop() {
    for (const s of e.stops.splice(0)) s()
    if (e.timer) clearTimeout(e.timer)
    e.started = false
  }

  return { start, stop, syncNow, run }
}
