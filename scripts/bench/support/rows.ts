// One benchmark row, as `npm run bench` prints it and writes it to bench/results.json.
// Each benchmark script calls recordRow for each figure it measured; scripts/bench/support/table.ts
// reads them all at the end. `floor` is measured in the same run; ratio = value / floor.
import { appendFileSync, mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'

export interface BenchRow {
  name: string
  value: number
  unit: string
  /** What the value is held against, measured in the same run; null where the target is absolute. */
  floor: number | null
  /** The goal in words, e.g. 'ratio ≤ 2', '≤ 250', '≥ 90', '0'. */
  target: string
  /** One line on what was measured (printed under the table). */
  note?: string
}

export const ROWS_FILE = resolve(process.env.WAYSIDE_BENCH_ROWS ?? 'bench/rows.jsonl')

export function recordRow(row: BenchRow): void {
  mkdirSync(dirname(ROWS_FILE), { recursive: true })
  appendFileSync(ROWS_FILE, `${JSON.stringify(row)}\n`)
  const ratio = row.floor ? ` (floor ${round(row.floor)} ${row.unit}, ratio ${round(row.value / row.floor)})` : ''
  console.log(`  ${row.name}: ${round(row.value)} ${row.unit}${ratio}, target ${row.target}`)
}

export const round = (n: number) => Math.round(n * 100) / 100
