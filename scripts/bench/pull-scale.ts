// A mechanic's first pull on the scale seed (a new phone: page after page while `more`), the median
// of several, beside selecting the same rows by primary key straight from PostgreSQL. Target: at
// most 3× the select. The card library and rates, which every first pull carries, are left out of
// the floor's tables but not of the pull.
import { randomUUID } from 'node:crypto'
import { recordRow } from './support/rows'
import { getJson, ROUNDS, scalePool, signIn, timed } from './support/scale'

type Answer = { cursor: string, more: boolean, changes: Record<string, { id: string }[]> }
const LIBRARY = new Set(['testCards', 'rates'])
const tableOf = (key: string) => key.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`)

export async function firstPull(cookie: string) {
  const clientId = randomUUID()
  const pages: Answer[] = []
  let cursor: string | undefined
  do {
    const q = new URLSearchParams({ clientId, ...(cursor ? { cursor } : {}) })
    const page = await getJson<Answer>(`/api/sync/pull?${q}`, cookie)
    pages.push(page)
    cursor = page.more ? page.cursor : undefined
  } while (cursor)
  return pages
}

const pool = scalePool()
try {
  const cookie = await signIn('mech1@wayside.test')
  const pages = await firstPull(cookie)
  const ids = new Map<string, string[]>()
  for (const p of pages) {
    for (const [key, rows] of Object.entries(p.changes)) {
      if (!LIBRARY.has(key)) ids.set(key, [...(ids.get(key) ?? []), ...rows.map(r => r.id)])
    }
  }
  const rows = [...ids.values()].reduce((n, xs) => n + xs.length, 0)
  const pullMs = await timed(() => firstPull(cookie), ROUNDS)
  const selectMs = await timed(async () => {
    for (const [key, list] of ids) if (list.length) await pool.query(`SELECT * FROM ${tableOf(key)} WHERE id = ANY($1::uuid[])`, [list])
  }, ROUNDS)
  const sizes = [...ids].filter(([, l]) => l.length).map(([k, l]) => `${k} ${l.length}`).join(', ')
  console.log(`  first pull: ${pages.length} pages, ${rows} rows (${sizes}) in ${pullMs.toFixed(0)} ms`)
  console.log(`  the same rows by primary key: ${selectMs.toFixed(0)} ms`)
  recordRow({
    name: 'pull-scale', value: pullMs, unit: 'ms', floor: selectMs, target: 'ratio ≤ 3',
    note: `mech1's first pull on the scale seed, ${pages.length} pages, ${rows} rows; medians of ${ROUNDS}`,
  })
}
finally {
  await pool.end()
}
