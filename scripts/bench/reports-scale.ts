// Every report over the last year of the scale seed, each the median of several requests; the
// slowest is held against counting every call in SQL. Target: at most 5× that count.
import { REPORT_NAMES } from '../../shared/schemas/reports'
import { recordRow } from './support/rows'
import { countFloor, getJson, scalePool, signIn, timed } from './support/scale'

const pool = scalePool()
try {
  const cookie = await signIn('office@wayside.test')
  const to = new Date()
  const from = new Date(to.getTime() - 364 * 86_400_000)
  const day = (d: Date) => d.toISOString().slice(0, 10)
  const times: [string, number][] = []
  for (const name of REPORT_NAMES) {
    const path = `/api/reports/${name}?from=${day(from)}&to=${day(to)}`
    const body = await getJson<{ rows: unknown[] }>(path, cookie)
    times.push([name, await timed(() => getJson(path, cookie), 3)])
    console.log(`  ${name.padEnd(16)} ${times.at(-1)![1].toFixed(1)} ms, ${body.rows.length} rows`)
  }
  const floor = await countFloor(pool)
  console.log(`  SELECT count(*) FROM calls: ${floor.toFixed(1)} ms`)
  const [slowest, ms] = times.reduce((a, b) => (b[1] > a[1] ? b : a))
  recordRow({
    name: 'reports-scale', value: ms, unit: 'ms', floor, target: 'ratio ≤ 5',
    note: `slowest report over one year: ${slowest}; ${times.map(([w, t]) => `${w} ${t.toFixed(0)}`).join(', ')} ms`,
  })
}
finally {
  await pool.end()
}
