// CSV for spreadsheets, written by csv-stringify. A text cell that a spreadsheet would read as a
// formula is neutralised by the OWASP CSV-injection rule: a cell starting with =, +, -, @, a tab or
// a carriage return gets a single quote in front and is quoted. Number columns (amounts,
// quantities) are written from numbers only, as plain digits with a leading minus when negative,
// so the spreadsheet still adds them up; anything else in a number column is left empty.
import type { H3Event } from 'h3'
import { stringify } from 'csv-stringify/sync'

export type CsvKind = 'text' | 'number' | 'money' | 'date'
export interface CsvColumn<R> { header: string, kind: CsvKind, value: (row: R) => unknown }

const FORMULA_START = /^[=+\-@\t\r]/
/** What a neutralised cell looks like once prefixed, so csv-stringify quotes it. */
const NEUTRALISED = /^'[=+\-@\t\r]/

/** A text cell made safe to open in a spreadsheet (OWASP "CSV Injection"). */
export function csvText(value: unknown): string {
  if (value === null || value === undefined) return ''
  const s = value instanceof Date ? value.toISOString() : String(value)
  return FORMULA_START.test(s) ? `'${s}` : s
}

/** A number cell: finite numbers only; money from integer cents as dollars with two decimals. */
export function csvNumber(value: unknown, kind: 'number' | 'money'): string {
  const n = typeof value === 'string' && value.trim() !== '' ? Number(value) : value
  if (typeof n !== 'number' || !Number.isFinite(n)) return ''
  if (kind === 'money') return (Math.round(n) / 100).toFixed(2)
  return String(n)
}

/** A date cell as YYYY-MM-DD (dates from the database, or ISO text). */
export function csvDate(value: unknown): string {
  if (value === null || value === undefined || value === '') return ''
  const d = value instanceof Date ? value : new Date(String(value))
  return Number.isNaN(d.getTime()) ? csvText(value) : d.toISOString().slice(0, 10)
}

export function csvCell(kind: CsvKind, value: unknown): string {
  if (kind === 'number' || kind === 'money') return csvNumber(value, kind)
  if (kind === 'date') return csvDate(value)
  return csvText(value)
}

/** The whole file: a header row, then one row per record; CRLF line ends as RFC 4180 has them. */
export function writeCsv<R>(columns: readonly CsvColumn<R>[], rows: readonly R[]): string {
  const body = rows.map(r => columns.map(c => csvCell(c.kind, c.value(r))))
  return stringify([columns.map(c => csvText(c.header)), ...body], { record_delimiter: 'windows', quoted_match: NEUTRALISED })
}

/** Answers with the CSV as a download named `filename`. */
export function sendCsv(event: H3Event, filename: string, text: string) {
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${filename.replace(/[^\w.-]/g, '_')}"`,
    'cache-control': 'no-store',
  })
  return text
}
