// What each report is called, what its columns say and how their values read: one registry for the
// page (headings, chart, table) and the server (CSV headers and cells), so people read words, never
// a column key or an enum value.
import type { ReportName } from '../schemas/reports'
import { OUTCOME_LABELS } from './callStatus'
import { COMEBACK_WINDOW_DAYS } from './comeback'

/** How a column's values read: `words` maps stored values (enums) to what people read. */
export type ReportColumnKind = 'text' | 'day' | 'week' | 'count' | 'money' | 'percent' | 'minutes' | 'hours' | 'days' | 'quantity'
  | 'callNumber'
export interface ReportColumn { key: string, label: string, kind: ReportColumnKind, words?: Record<string, string> }
export interface ReportChart {
  type: 'bar' | 'line'
  /** The column along the bottom. */
  x: string
  /** Columns drawn as series (numbers), each in its own theme colour. */
  series: string[]
  /** Draw one series per value of this column (a mechanic), of the first `series` column. */
  groupBy?: string
}
export interface ReportSpec { title: string, about: string, columns: ReportColumn[], chart: ReportChart }

export const REPORTS: Record<ReportName, ReportSpec> = {
  'calls-per-day': {
    title: 'Calls per day',
    about: 'Road calls taken each day, and how many of them were finished or cancelled.',
    columns: [
      { key: 'day', label: 'Day', kind: 'day' },
      { key: 'received', label: 'Calls taken', kind: 'count' },
      { key: 'completed', label: 'Finished', kind: 'count' },
      { key: 'cancelled', label: 'Cancelled', kind: 'count' },
    ],
    chart: { type: 'bar', x: 'day', series: ['received', 'completed', 'cancelled'] },
  },
  'response-times': {
    title: 'Response times',
    about: 'Median minutes from the call to a mechanic being assigned, and to the mechanic reaching the truck,'
      + ' by the day the call came in.',
    columns: [
      { key: 'day', label: 'Day', kind: 'day' },
      { key: 'calls', label: 'Calls', kind: 'count' },
      { key: 'medianToAssignMin', label: 'Minutes to assign (median)', kind: 'minutes' },
      { key: 'medianToArriveMin', label: 'Minutes to reach the truck (median)', kind: 'minutes' },
    ],
    chart: { type: 'line', x: 'day', series: ['medianToAssignMin', 'medianToArriveMin'] },
  },
  'fix-rate': {
    title: 'How finished calls ended',
    about: 'Finished calls by how they ended, and each outcome\'s share of the period.',
    columns: [
      { key: 'outcome', label: 'Outcome', kind: 'text', words: OUTCOME_LABELS },
      { key: 'calls', label: 'Calls', kind: 'count' },
      { key: 'pct', label: 'Share', kind: 'percent' },
    ],
    chart: { type: 'bar', x: 'outcome', series: ['calls'] },
  },
  'mechanic-weeks': {
    title: 'Mechanics by week',
    about: `Per mechanic and week (Monday to Sunday): calls finished; first-visit fixes (repaired at the roadside and no comeback`
      + ` within ${COMEBACK_WINDOW_DAYS} days); invoiced before tax; hours on the work clock.`,
    columns: [
      { key: 'week', label: 'Week of', kind: 'week' },
      { key: 'mechanic', label: 'Mechanic', kind: 'text' },
      { key: 'finished', label: 'Calls finished', kind: 'count' },
      { key: 'firstVisitFixes', label: 'Fixed on the first visit', kind: 'count' },
      { key: 'firstVisitFixPct', label: 'First-visit fix rate', kind: 'percent' },
      { key: 'revenueCents', label: 'Invoiced before tax', kind: 'money' },
      { key: 'laborHours', label: 'Hours worked', kind: 'hours' },
    ],
    chart: { type: 'bar', x: 'week', series: ['firstVisitFixPct'], groupBy: 'mechanic' },
  },
  'comebacks': {
    title: `Comebacks: the same fault code on the same unit within ${COMEBACK_WINDOW_DAYS} days`,
    about: 'Each call that brought back a fault code an earlier call on the same unit had recorded.',
    columns: [
      { key: 'unitNumber', label: 'Unit', kind: 'text' },
      { key: 'customer', label: 'Customer', kind: 'text' },
      { key: 'code', label: 'Fault code', kind: 'text' },
      { key: 'firstCall', label: 'First call', kind: 'callNumber' },
      { key: 'repeatCall', label: 'Came back on call', kind: 'callNumber' },
      { key: 'days', label: 'Days between', kind: 'days' },
    ],
    chart: { type: 'bar', x: 'unitNumber', series: ['days'] },
  },
  'revenue': {
    title: 'Invoiced per day',
    about: 'Invoices sent each day (void ones left out), what they came to, and how much of that is paid so far.',
    columns: [
      { key: 'day', label: 'Day', kind: 'day' },
      { key: 'invoices', label: 'Invoices', kind: 'count' },
      { key: 'totalCents', label: 'Invoiced', kind: 'money' },
      { key: 'paidCents', label: 'Paid so far', kind: 'money' },
    ],
    chart: { type: 'bar', x: 'day', series: ['totalCents', 'paidCents'] },
  },
  'parts': {
    title: 'Parts used',
    about: 'Parts put on calls taken in the period, most used first.',
    columns: [
      { key: 'partNumber', label: 'Part number', kind: 'text' },
      { key: 'description', label: 'Description', kind: 'text' },
      { key: 'quantity', label: 'Quantity', kind: 'quantity' },
      { key: 'calls', label: 'On calls', kind: 'count' },
    ],
    chart: { type: 'bar', x: 'partNumber', series: ['quantity'] },
  },
}

/** A cell's words for people: an enum value as its label, money in dollars, nothing as a dash. */
export function reportCellText(col: ReportColumn, value: unknown): string {
  if (value === null || value === undefined || value === '') return '—'
  if (col.words) return col.words[String(value)] ?? String(value)
  const n = Number(value)
  switch (col.kind) {
    case 'money': return `$${(n / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`
    case 'percent': return `${n.toFixed(1)} %`
    case 'minutes': return `${n.toFixed(1)} min`
    case 'hours': return `${n.toFixed(1)} h`
    case 'days': return `${n.toFixed(1)} days`
    case 'callNumber': return `#${n}`
    case 'count': case 'quantity': return n.toLocaleString('en-US')
    default: return String(value)
  }
}

/** Is the column a measure a chart draws (a call number is a name, not a measure). */
export function isMeasureColumn(col: ReportColumn) {
  return !['text', 'day', 'week', 'callNumber'].includes(col.kind)
}
