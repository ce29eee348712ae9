// The outbox as the screens see it, and one sync pass: push the waiting ops in seq order (at most
// 500 a batch), upload photo bytes whose op the server applied, then pull what changed. When to
// run a pass (start, online, visibility, timer, button), backoff and the one-tab lock live in
// useSync. Nothing leaves the outbox until the server answered applied, duplicate or conflict.
import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { getClientId, getMeta, readBundles, readJournal, readOutbox, setLibrary, setMeta, type DeviceRow, type JournalEntry, type OutboxEntry } from '../utils/fieldDb'
import { applyPull, applyPushResults, photoConfirmed, photoFailed, readPhotoQueue, realignSeq } from '../utils/syncApply'
import { expectedSeqOf, parseAnswer, photoPutAnswerSchema, pullAnswerSchema, pushResultSchema, retryAfterMs, stockAnswerSchema } from '../utils/syncWire'

export const PUSH_BATCH = 500
export type SyncFetch = (url: string, init?: RequestInit) => Promise<Response>
export type SyncPosition = { lat: number, lon: number, at: string }
export type SyncFailure = 'offline' | 'signin' | 'update' | 'invalid' | 'server'
export type SyncOutcome = { ok: true, changedCalls: string[] } | { ok: false, kind: SyncFailure, message: string, retryAfterMs?: number }
export type PhotoWaiting = { id: string, callId: string, size: number, opApplied: boolean, tries: number, lastError?: string }
/** An open conflict on one of the phone's calls that no choice has been made for yet. */
export type ToSettle = { callId: string, conflictId: string, field: string, callNumber: number | null }

const JSON_HEADERS = { 'X-Wayside': '1', 'Content-Type': 'application/json', 'Accept': 'application/json' }

class SyncStop extends Error {
  constructor(readonly kind: SyncFailure, message: string, readonly retryAfterMs?: number) { super(message) }
}

async function request(doFetch: SyncFetch, url: string, init: RequestInit): Promise<{ res: Response, text: string }> {
  let res: Response
  try { res = await doFetch(url, { credentials: 'same-origin', cache: 'no-store', ...init }) }
  catch { throw new SyncStop('offline', 'No connection to Wayside') }
  const text = await res.text().catch(() => '')
  if (res.status === 401) throw new SyncStop('signin', 'Sign in again to send your work; it stays on the phone until then')
  if (res.status === 426) throw new SyncStop('update', 'This version of Wayside is too old for the server: update the app')
  if (res.status === 429 || res.status >= 500) {
    throw new SyncStop('server', `Wayside is busy (${res.status}); trying again shortly`, retryAfterMs(res.headers.get('Retry-After')))
  }
  return { res, text }
}

export const useOutboxStore = defineStore('outbox', () => {
  const entries = ref<OutboxEntry[]>([])
  const journal = ref<JournalEntry[]>([])
  const photos = ref<PhotoWaiting[]>([])
  const lastSyncAt = ref<string | null>(null)
  const lastAttemptAt = ref<string | null>(null)
  const lastError = ref<string | null>(null)
  /** Why sync is stopped until the person acts: sign in again, update the app, or another person's work waits here. */
  const paused = ref<'signin' | 'update' | 'owner' | null>(null)
  const syncing = ref(false)
  const nextAttemptAt = ref<number | null>(null)
  /** Bumped after every local write, so the engine can sync soon. */
  const writes = ref(0)
  /** Bumped after a pull changed calls, so open screens re-read them. */
  const pulls = ref(0)
  /** Bumped after a pull brought test cards, so the library re-reads the device. */
  const libraryPulls = ref(0)
  /** Open conflicts on the phone's calls that no choice has been made for yet. */
  const settle = ref<ToSettle[]>([])
  const toSettle = computed(() => settle.value.length)
  /** Whether the last request reached Wayside: false after a network failure, null before any (or after `online`). */
  const reachable = ref<boolean | null>(null)
  /** A word for the person about the last thing they asked (Sync now with no signal). */
  const notice = ref<string | null>(null)

  const pending = computed(() => entries.value.filter(e => e.state === 'pending'))
  const rejected = computed(() => entries.value.filter(e => e.state === 'rejected'))
  const waitingCount = computed(() => pending.value.length + photos.value.length)
  const isEmpty = computed(() => entries.value.length === 0 && photos.value.length === 0)

  async function refresh() {
    const [o, j, p, last, bundles] = await Promise.all([readOutbox(), readJournal(50), readPhotoQueue(), getMeta<string>('lastSyncAt'), readBundles()])
    settle.value = bundles.flatMap(b => Object.values(b.records.conflicts ?? {})
      .filter(c => (c.status ?? 'open') === 'open' && !c.pendingChoice)
      .map(c => ({ callId: b.id, conflictId: c.id, field: String(c.field ?? ''), callNumber: typeof b.call.number === 'number' ? b.call.number : null })))
    entries.value = o
    journal.value = j
    photos.value = p.map(x => ({ id: x.id, callId: x.callId, size: x.size, opApplied: x.opApplied, tries: x.tries, lastError: x.lastError }))
    lastSyncAt.value = last ?? null
  }

  async function noteWrite() {
    await refresh()
    writes.value++
  }

  async function push(doFetch: SyncFetch, clientId: string, position?: SyncPosition) {
    for (let round = 0, realigned = 0; round < 1000; round++) {
      const batch = (await readOutbox()).filter(e => e.state === 'pending').slice(0, PUSH_BATCH)
      if (!batch.length && (!position || round > 0)) return
      const ops = batch.map(({ callId: _c, state: _s, reason: _r, tries: _t, ...op }) => op)
      const body: Record<string, unknown> = { clientId, ops }
      if (position && round === 0) body.position = position
      const { res, text } = await request(doFetch, '/api/sync/push', { method: 'POST', headers: JSON_HEADERS, body: JSON.stringify(body) })
      if (res.status === 409) {
        // The server expects another seq: ops below it are stored there already, or the outbox has a gap.
        const expected = expectedSeqOf(text) ?? ((await pullLastSeq(doFetch, clientId)) + 1)
        if (++realigned > 3) throw new SyncStop('server', `The server keeps asking for op ${expected}; try Sync now later`)
        await realignSeq(expected)
        continue
      }
      if (!res.ok) throw new SyncStop('server', `The server refused the batch (${res.status}): ${messageOf(text)}`)
      const answer = parseAnswer(pushResultSchema, text)
      if (!answer) throw new SyncStop('invalid', 'The answer did not come from Wayside (a Wi-Fi sign-in page?); nothing was marked sent')
      const answered = await applyPushResults(batch, answer)
      if (!batch.length) return
      if (answered === 0) throw new SyncStop('server', 'The server answered none of the ops sent; trying again later')
    }
  }

  async function pullUrl(clientId: string) {
    const cursor = await getMeta<string | number>('cursor')
    const q = new URLSearchParams({ clientId })
    if (cursor !== undefined) q.set('cursor', String(cursor))
    return { url: `/api/sync/pull?${q}`, cursor }
  }

  async function pullLastSeq(doFetch: SyncFetch, clientId: string): Promise<number> {
    const { url } = await pullUrl(clientId)
    const { res, text } = await request(doFetch, url, { headers: JSON_HEADERS })
    const answer = res.ok ? parseAnswer(pullAnswerSchema, text) : undefined
    if (!answer) throw new SyncStop('invalid', 'Could not read the server\'s last op number')
    return answer.lastSeq
  }

  async function uploadPhotos(doFetch: SyncFetch) {
    for (const p of (await readPhotoQueue()).filter(x => x.opApplied)) {
      const { res, text } = await request(doFetch, `/api/photos/${p.id}`, {
        method: 'PUT', body: p.bytes,
        headers: { 'X-Wayside': '1', 'Content-Type': p.contentType, 'X-Content-Sha256': p.sha256, 'Accept': 'application/json' },
      })
      const answer = res.ok ? parseAnswer(photoPutAnswerSchema, text) : undefined
      if (answer && answer.sha256.toLowerCase() === p.sha256.toLowerCase()) await photoConfirmed(p.id, p.sha256)
      else await photoFailed(p.id, res.ok ? 'The server did not confirm the photo' : `Upload refused (${res.status}): ${messageOf(text)}`)
    }
  }

  async function pull(doFetch: SyncFetch, clientId: string): Promise<string[]> {
    const changed = new Set<string>()
    let cards = 0
    for (let page = 0; page < 50; page++) {
      const { url, cursor } = await pullUrl(clientId)
      const { res, text } = await request(doFetch, url, { headers: JSON_HEADERS })
      if (!res.ok) throw new SyncStop('server', `Could not fetch changes (${res.status}): ${messageOf(text)}`)
      const answer = parseAnswer(pullAnswerSchema, text)
      if (!answer) throw new SyncStop('invalid', 'The answer did not come from Wayside (a Wi-Fi sign-in page?)')
      for (const id of await applyPull(answer)) changed.add(id)
      cards += answer.changes.testCards?.length ?? 0
      if (!answer.more || String(answer.cursor) === String(cursor)) break
    }
    if (cards) libraryPulls.value++
    return [...changed]
  }

  /**
   * The stock of the trucks on the phone's open calls, so part lines can be picked with no signal.
   * Read at most every quarter hour; a failure here never fails the pass.
   */
  async function refreshStock(doFetch: SyncFetch) {
    const last = await getMeta<number>('stockFetchedAt')
    if (last && Date.now() - last < 15 * 60_000) return
    const trucks = new Set((await readBundles()).filter(b => !['invoiced', 'paid', 'cancelled'].includes(String(b.call.status)))
      .map(b => b.call.serviceTruckId).filter((t): t is string => typeof t === 'string'))
    const found: DeviceRow[] = []
    for (const id of trucks) {
      const res = await doFetch(`/api/service-trucks/${id}/stock`, { headers: JSON_HEADERS, credentials: 'same-origin' }).catch(() => null)
      const body = res?.ok ? parseAnswer(stockAnswerSchema, await res.text()) : undefined
      if (!body) return
      found.push(...body.items)
    }
    await setLibrary('truckStock', Object.fromEntries(found.map(r => [r.id, r])))
    await setMeta('stockFetchedAt', Date.now())
  }

  /** One whole pass: push, photos, pull. Never throws; says what happened. */
  async function runOnce(opts: { fetch?: SyncFetch, position?: SyncPosition } = {}): Promise<SyncOutcome> {
    const doFetch = opts.fetch ?? ((url, init) => globalThis.fetch(url, init))
    syncing.value = true
    lastAttemptAt.value = new Date().toISOString()
    try {
      const clientId = await getClientId()
      await push(doFetch, clientId, opts.position)
      await uploadPhotos(doFetch)
      const changedCalls = await pull(doFetch, clientId)
      await refreshStock(doFetch).catch(() => {})
      const now = new Date().toISOString()
      await setMeta('lastSyncAt', now)
      if (opts.position) await setMeta('positionSentAt', opts.position.at)
      lastError.value = null
      notice.value = null
      reachable.value = true
      paused.value = null
      if (changedCalls.length) pulls.value++
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
      await refresh().catch(() => {})
    }
  }

  return {
    entries, journal, photos, lastSyncAt, lastAttemptAt, lastError, paused, syncing, nextAttemptAt, writes, pulls, libraryPulls, settle, toSettle, reachable, notice,
    pending, rejected, waitingCount, isEmpty, refresh, noteWrite, runOnce,
  }
})

function messageOf(text: string): string {
  try {
    const b = JSON.parse(text) as Record<string, any>
    return String(b.statusText ?? b.statusMessage ?? b.message ?? 'no reason given')
  }
  catch { return text ? 'not a Wayside answer' : 'no reason given' }
}

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useOutboxStore, import.meta.hot))
