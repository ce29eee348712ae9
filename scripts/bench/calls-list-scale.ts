// The dispatch list on the scale seed (100,000 calls): the first page, a status filter, a text
// search and page 500, each the median of several requests; the slowest is held against counting
// every call in SQL. Target: at most 1.5× that count.
import { recordRow } from './support/rows'
import { countFloor, getJson, scalePool, signIn, timed } from './support/scale'

const CASES: [string, string][] = [
  ['first page', '/api/calls'],
  ['status filter', '/api/calls?status=invoiced'],
  ['text search', '/api/calls?q=Ironwood'],
  ['page 500', '/api/calls?page=500'],
]

const pool = scalePool()
try {
  const cookie = await signIn('dispatch@wayside.test')
  const times: [string, number][] = []
  for (const [what, path] of CASES) {
    const body = await getJson<{ items: unknown[], total: number }>(path, cookie)
    if (!body.items.length) throw new Error(`${what}: no calls (is the scale seed loaded?)`)
    times.push([what, await timed(() => getJson(path, cookie))])
  }
  const floor = await countFloor(pool)
  for (const [what, ms] of times) console.log(`  ${what.padEnd(14)} ${ms.toFixed(1)} ms`)
  console.log(`  SELECT count(*) FROM calls: ${floor.toFixed(1)} ms`)
  const [slowest, ms] = times.reduce((a, b) => (b[1] > a[1] ? b : a))
  recordRow({
    name: 'calls-list-scale', value: ms, unit: 'ms', floor, target: 'ratio ≤ 1.5',
    note: `slowest of ${times.map(([w, t]) => `${w} ${t.toFixed(0)} ms`).join(', ')} (${slowest}); medians over HTTP`,
  })
}
finally {
  await pool.end()
}
