// The phone's sync client: one pass over the wire, in the protocol's order. Push the waiting ops
// in seq order (at most PUSH_BATCH a batch), upload the photo bytes whose op the server applied,
// pull what changed (following the server's pages) and apply it, then refresh the truck stock.
// What each answer does to the device is app/utils/syncApply.ts; when a pass runs, its backoff
// and the one-tab lock are the sync store's (app/stores/sync.ts). Nothing leaves the outbox until
// the server answered applied, duplicate or conflict.
import { isLockedStatus } from '#shared/utils/callStatus'
import { getMeta, readBundles, readOutbox, readPhotoQueue } from './deviceRead'
import { getClientId, setLibrary, setMeta, type DeviceRow } from './fieldDb'
import { applyPull, applyPushResults, photoConfirmed, photoFailed, realignSeq } from './syncApply'
import {
  expectedSeqOf, parseAnswer, photoPutAnswerSchema, pullAnswerSchema, pushResultSchema, retryAfterMs, stockAnswerSchema,
} from './syncWire'

export const PUSH_BATCH = 500
/** Pages of one pull at most, so a server that keeps saying `more` cannot hold the pass forever. */
export const PULL_MAX_PAGES = 200
export type SyncFetch = (url: string, init?: RequestInit) => Promise<Response>
export type SyncPosition = { lat: number, lon: number, at: string }
export type SyncFailure = 'offline' | 'signin' | 'update' | 'invalid' | 'server'
/** What a whole pass brought: the calls it changed and whether the card library changed. */
export type PassResult = { changedCalls: string[], cards: number }

/** Calls whose truck stock the phone no longer needs. */
const JSON_HEADERS = { 'X-Wayside': '1', 'Content-Type': 'application/json', 'Accept': 'application/json' }

/** Why a pass stopped; the sync store turns it into what the person reads and when to try again. */
export class SyncStop extends Error {
  constructor(readonly kind: SyncFailure, message: string, readonly retryAfterMs?: number) { super(message) }
}

async function request(doFetch: SyncFetch, url: string, init: RequestInit): Promise<{ res: Response, text: string }> {
  let res: Response
  try {
    res = await doFetch(url, { credentials: 'same-origin', cache: 'no-store', ...init })
  }
  catch { throw new SyncStop('offline', 'No connection to Wayside') }
  const text = await res.text().catch(() => '')
  if (res.status === 401) throw new SyncStop('signin', 'Sign in again to send your work; it stays on the phone until then')
  if (res.status === 426) throw new SyncStop('update', 'This version of Wayside is too old for the server: update the app')
  if (res.status === 429 || res.status >= 500) {
    throw new SyncStop('server', `Wayside is busy (${res.status}); trying again shortly`, retryAfterMs(res.headers.get('Retry-After')))
  }
  return { res, text }
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

/**
 * Pulls page after page while the server says `more`; each page is applied (and its cursor kept)
 * before the next is asked for, so a pass cut short resumes where it stopped.
 */
async function pull(doFetch: SyncFetch, clientId: string): Promise<PassResult> {
  const changed = new Set<string>()
  let cards = 0
  for (let page = 0; page < PULL_MAX_PAGES; page++) {
    const { url, cursor } = await pullUrl(clientId)
    const { res, text } = await request(doFetch, url, { headers: JSON_HEADERS })
    if (!res.ok) throw new SyncStop('server', `Could not fetch changes (${res.status}): ${messageOf(text)}`)
    const answer = parseAnswer(pullAnswerSchema, text)
    if (!answer) throw new SyncStop('invalid', 'The answer did not come from Wayside (a Wi-Fi sign-in page?)')
    for (const id of await applyPull(answer)) changed.add(id)
    cards += answer.changes.testCards?.length ?? 0
    if (!answer.more) break
    // A server that says `more` without moving the cursor would loop: stop and try later.
    if (String(answer.cursor) === String(cursor)) throw new SyncStop('server', 'The server sent the same page twice; trying again later')
  }
  return { changedCalls: [...changed], cards }
}

/**
 * The stock of the trucks on the phone's open calls, so part lines can be picked with no signal.
 * Read at most every quarter hour; a failure here never fails the pass.
 */
async function refreshStock(doFetch: SyncFetch) {
  const last = await getMeta<number>('stockFetchedAt')
  if (last && Date.now() - last < 15 * 60_000) return
  const trucks = new Set((await readBundles()).filter(b => !isLockedStatus(String(b.call.status)))
    .map(b => b.call.serviceTruckId).filter((t): t is string => typeof t === 'string'))
  const found: DeviceRow[] = []
  const yards: Record<string, DeviceRow> = {}
  for (const id of trucks) {
    const res = await doFetch(`/api/service-trucks/${id}/stock`, { headers: JSON_HEADERS, credentials: 'same-origin' }).catch(() => null)
    const body = res?.ok ? parseAnswer(stockAnswerSchema, await res.text()) : undefined
    if (!body) return
    found.push(...body.items)
    if (body.truck) yards[body.truck.id] = body.truck
  }
  await setLibrary('truckStock', Object.fromEntries(found.map(r => [r.id, r])))
  await setLibrary('serviceTrucks', yards)
  await setMeta('stockFetchedAt', Date.now())
}

/** One whole pass: push, photos, pull, stock. Throws SyncStop when it cannot finish. */
export async function syncPass(doFetch: SyncFetch, position?: SyncPosition): Promise<PassResult> {
  const clientId = await getClientId()
  await push(doFetch, clientId, position)
  await uploadPhotos(doFetch)
  const result = await pull(doFetch, clientId)
  await refreshStock(doFetch).catch(() => {})
  await setMeta('lastSyncAt', new Date().toISOString())
  if (position) await setMeta('positionSentAt', position.at)
  return result
}

function messageOf(text: string): string {
  try {
    const b = JSON.parse(text) as Record<string, unknown>
    return String(b.statusText ?? b.statusMessage ?? b.message ?? 'no reason given')
  }
  catch { return text ? 'not a Wayside answer' : 'no reason given' }
}
