import { sql } from 'drizzle-orm'

// For a load balancer: 200 while this server can reach its database and its photo storage, 503
// with Retry-After while either does not answer (so traffic goes to another server meanwhile).
// Public, cheap, and it says nothing beyond "ok" or which part is down.
const PROBE_MS = 2000
const PROBE_KEY = 'health:probe'

function within<T>(ms: number, work: Promise<T>): Promise<T> {
  return Promise.race([work, new Promise<T>((_, reject) => setTimeout(() => reject(new Error('timed out')), ms))])
}

async function check(work: () => Promise<unknown>): Promise<'ok' | 'down'> {
  try {
    await within(PROBE_MS, work())
    return 'ok'
  }
  catch {
    return 'down'
  }
}

/**
 * The photo store answers when a small marker object is there to be found: a stat on a folder, a
 * HEAD on a bucket. The marker is written the first time; a store that cannot keep it (a missing
 * bucket, refused keys) counts as down, like one that does not answer at all.
 */
async function photoStoreAnswers() {
  const store = useStorage('uploads')
  if (await store.hasItem(PROBE_KEY)) return
  await store.setItem(PROBE_KEY, 'Wayside health marker')
  if (!await store.hasItem(PROBE_KEY)) throw new Error('the photo store did not keep the health marker')
}

export default defineEventHandler(async (event) => {
  const [database, storage] = await Promise.all([
    check(() => useDb().execute(sql`SELECT 1`)),
    check(photoStoreAnswers),
  ])
  const ok = database === 'ok' && storage === 'ok'
  setResponseHeader(event, 'cache-control', 'no-store')
  if (!ok) {
    setResponseStatus(event, 503, 'Service Unavailable')
    setResponseHeader(event, 'retry-after', 5)
  }
  return { ok, database, storage }
})
