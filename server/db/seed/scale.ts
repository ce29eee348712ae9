// npm run seed:scale: loads years of an invented busy shop (server/db/seed/scaleSql.ts) into the
// database NUXT_DATABASE_URL names, after the demo seed, and says how long it took. A second run
// finds the history there and leaves it.
import pg from 'pg'
import { FULL_SCALE, loadScale, scaleCounts } from './scaleSql'

const url = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside'
const client = new pg.Client({ connectionString: url })
await client.connect()
try {
  const started = performance.now()
  const loaded = await loadScale(client, FULL_SCALE, !!process.env.WAYSIDE_SCALE_VERBOSE)
  const seconds = ((performance.now() - started) / 1000).toFixed(1)
  const n = await scaleCounts(client)
  const sizes = `${n.calls} calls, ${n.readings} readings, ${n.units} units, ${n.customers} customers`
  console.log(loaded ? `[wayside] scale history loaded in ${seconds} s: ${sizes}` : `[wayside] scale history already there: ${sizes}`)
}
finally {
  await client.end()
}
