// Reads the rows the benchmarks recorded, prints one table and writes bench/results.json as
// [{ name, value, unit, floor, ratio, target, met }]. Targets are goals: this never fails the run.
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { ROWS_FILE, round, type BenchRow } from './rows'

const ORDER = [
  'sync-push', 'pull-scale', 'calls-list-scale', 'reports-scale', 'calls-list-load-p99', 'push-load-p99', 'load-errors',
  'server-rss-peak', 'mechanic-js', 'dispatch-js', 'offline-cold-start', 'invoice-pdf', 'pull-wire', 'lighthouse-mechanic',
  'lighthouse-dispatch',
]

/** Whether a row meets its target: 'ratio ≤ 2' on the ratio, '≤ 250' / '≥ 90' / '0' on the value. */
export function meets(row: BenchRow): boolean | null {
  const m = /^(ratio\s*)?(≤|≥|<|>|=)?\s*([\d.]+)/.exec(row.target.replace(/,/g, ''))
  if (!m) return null
  const x = m[1] ? (row.floor ? row.value / row.floor : Number.NaN) : row.value
  const goal = Number(m[3])
  if (Number.isNaN(x)) return null
  switch (m[2]) {
    case '≥': return x >= goal
    case '>': return x > goal
    case '<': return x < goal
    case '≤': return x <= goal
    default: return x === goal
  }
}

const rows: BenchRow[] = existsSync(ROWS_FILE)
  ? readFileSync(ROWS_FILE, 'utf8').split('\n').filter(Boolean).map(l => JSON.parse(l) as BenchRow)
  : []
// The last figure recorded under a name wins (a benchmark re-run in the same session).
const byName = new Map(rows.map(r => [r.name, r]))
const names = [...ORDER.filter(n => byName.has(n)), ...[...byName.keys()].filter(n => !ORDER.includes(n))]
const results = names.map((n) => {
  const r = byName.get(n)!
  return { ...r, ratio: r.floor ? round(r.value / r.floor) : null, met: meets(r) }
})
const missing = ORDER.filter(n => !byName.has(n))

const cells = results.map(r => [
  r.name, `${round(r.value)} ${r.unit}`, r.floor === null ? '—' : `${round(r.floor)} ${r.unit}`,
  r.ratio === null ? '—' : `${r.ratio}×`, r.target, r.met === null ? '?' : r.met ? 'met' : 'NOT met',
])
const head = ['name', 'value', 'floor', 'ratio', 'target', '']
const widths = head.map((h, i) => Math.max(h.length, ...cells.map(c => c[i]!.length)))
const line = (c: string[]) => `| ${c.map((x, i) => x.padEnd(widths[i]!)).join(' | ')} |`
console.log(`\n${line(head)}\n|${widths.map(w => '-'.repeat(w + 2)).join('|')}|`)
for (const c of cells) console.log(line(c))
for (const r of results) if (r.note) console.log(`  ${r.name}: ${r.note}`)
if (missing.length) console.log(`\nnot measured in this run: ${missing.join(', ')}`)
writeFileSync(resolve('bench/results.json'), `${JSON.stringify(results, null, 2)}\n`)
console.log('\nwritten: bench/results.json')
