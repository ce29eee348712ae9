// Each report is SQL over [from, to] inclusive, in local days of the business's time zone; answers
// `{ from, to, rows }` with the columns the label registry (shared/utils/reportLabels.ts) names.
// When a call reached a status is read from its timeline (call_events.at: when it happened), the
// call's own column only for a call with no such event. Comebacks are found by the one rule in
// shared/utils/comeback.ts, the same the unit history uses; SQL only fetches the calls it reads.
import { sql, type SQL } from 'drizzle-orm'
import type { ReportName, ReportRange } from '#shared/schemas/reports'
import { DONE_STATUSES, sqlStatusList } from '#shared/utils/callStatus'
import { COMEBACK_WINDOW_DAYS, findComebacks, type Comeback, type ComebackFaultCode } from '#shared/utils/comeback'
import { isMeasureColumn, REPORTS, reportCellText, type ReportColumnKind } from '#shared/utils/reportLabels'
import type { CsvColumn } from './csv'

type Ctx = { from: string, to: string, zone: string }

/** When the call first reached `status`, by its timeline; else the call's column. */
const reached = (status: 'assigned' | 'on_site' | 'completed', column: string) => sql`coalesce(
  (SELECT min(e.at) FROM call_events e WHERE e.call_id = c.id AND e.to_status = ${status}), ${sql.raw(`c.${column}`)})`
const localDay = (at: SQL, zone: string) => sql`(${at} AT TIME ZONE ${zone})::date`
const inRange = (day: SQL, r: Ctx) => sql`${day} BETWEEN ${r.from}::date AND ${r.to}::date`

const QUERIES: Record<Exclude<ReportName, 'comebacks' | 'mechanic-weeks'>, (r: Ctx) => SQL> = {
  'calls-per-day': r => sql`
    SELECT to_char(d, 'YYYY-MM-DD') AS day,
      count(c.id)::int AS received,
      count(c.id) FILTER (WHERE c.status IN (${sql.raw(sqlStatusList(DONE_STATUSES))}))::int AS completed,
      count(c.id) FILTER (WHERE c.status = 'cancelled')::int AS cancelled
    FROM generate_series(${r.from}::date, ${r.to}::date, interval '1 day') d
    LEFT JOIN calls c ON ${localDay(sql`c.received_at`, r.zone)} = d::date
    GROUP BY d ORDER BY d`,
  'response-times': r => sql`
    WITH t AS (
      SELECT c.received_at, ${reached('assigned', 'assigned_at')} AS assigned, ${reached('on_site', 'on_site_at')} AS on_site
      FROM calls c WHERE ${inRange(localDay(sql`c.received_at`, r.zone), r)}
    )
    SELECT to_char(${localDay(sql`received_at`, r.zone)}, 'YYYY-MM-DD') AS day, count(*)::int AS calls,
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM assigned - received_at) / 60)::numeric, 1)::float
        AS "medianToAssignMin",
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM on_site - received_at) / 60)::numeric, 1)::float
        AS "medianToArriveMin"
    FROM t WHERE assigned IS NOT NULL
    GROUP BY 1 ORDER BY 1`,
  'fix-rate': r => sql`
    WITH done AS (SELECT c.outcome, ${reached('completed', 'completed_at')} AS at FROM calls c WHERE c.outcome IS NOT NULL)
    SELECT outcome::text, count(*)::int AS calls,
      round(100.0 * count(*) / sum(count(*)) OVER (), 1)::float AS pct
    FROM done WHERE ${inRange(localDay(sql`at`, r.zone), r)}
    GROUP BY outcome ORDER BY calls DESC, outcome`,
  'revenue': r => sql`
    SELECT to_char(${localDay(sql`i.sent_at`, r.zone)}, 'YYYY-MM-DD') AS day, count(*)::int AS invoices,
      sum(i.total_cents)::int AS "totalCents", sum(i.paid_cents)::int AS "paidCents"
    FROM invoices i WHERE i.status IN ('sent', 'paid') AND i.sent_at IS NOT NULL
      AND ${inRange(localDay(sql`i.sent_at`, r.zone), r)}
    GROUP BY 1 ORDER BY 1`,
  'parts': r => sql`
    SELECT p.part_number AS "partNumber", min(p.description) AS description,
      sum(p.quantity)::float AS quantity, count(DISTINCT p.call_id)::int AS calls
    FROM part_lines p JOIN calls c ON c.id = p.call_id WHERE ${inRange(localDay(sql`c.received_at`, r.zone), r)}
    GROUP BY p.part_number ORDER BY quantity DESC, "partNumber"`,
}

interface CallCodes {
  id: string
  number: number
  unitId: string
  receivedAt: Date
  unitNumber: string
  customer: string
  codes: ComebackFaultCode[]
}

/**
 * Comebacks among the calls taken from `before` days ahead of `from` to `after` days past `to`,
 * unit by unit, by the shared rule. Every call of a unit counts, as on the unit history.
 */
async function comebacksAround(r: Ctx, before: number, after: number) {
  const res = await useDb().execute(sql`
    SELECT c.id, c.number, c.unit_id AS "unitId", c.received_at AS "receivedAt", u.unit_number AS "unitNumber", cu.name AS customer,
      coalesce(json_agg(json_build_object('code', f.code, 'spn', f.spn, 'fmi', f.fmi)) FILTER (WHERE f.id IS NOT NULL), '[]') AS codes
    FROM calls c JOIN units u ON u.id = c.unit_id JOIN customers cu ON cu.id = u.customer_id
      LEFT JOIN fault_codes f ON f.call_id = c.id
    WHERE ${localDay(sql`c.received_at`, r.zone)} BETWEEN ${r.from}::date - ${before}::int AND ${r.to}::date + ${after}::int
    GROUP BY c.id, u.unit_number, cu.name`)
  const calls = res.rows as unknown as CallCodes[]
  const byUnit = new Map<string, CallCodes[]>()
  for (const c of calls) byUnit.set(c.unitId, [...(byUnit.get(c.unitId) ?? []), c])
  const found: Comeback[] = []
  for (const unitCalls of byUnit.values()) {
    found.push(...findComebacks(unitCalls.map(c => ({ id: c.id, at: new Date(c.receivedAt), faultCodes: c.codes }))))
  }
  return { found, calls: new Map(calls.map(c => [c.id, c])) }
}

/** Comebacks whose repeat call was taken in the range, latest first. */
async function comebackRows(r: Ctx) {
  // A day's slack either side: the window is in exact days, the range in local days.
  const { found, calls } = await comebacksAround(r, COMEBACK_WINDOW_DAYS + 1, 0)
  const day = new Intl.DateTimeFormat('en-CA', { timeZone: r.zone, year: 'numeric', month: '2-digit', day: '2-digit' })
  return found
    .map(x => ({ x, later: calls.get(x.callId)!, earlier: calls.get(x.earlierCallId)! }))
    .filter(({ later }) => {
      const d = day.format(new Date(later.receivedAt))
      return d >= r.from && d <= r.to
    })
    .sort((a, b) => new Date(b.later.receivedAt).getTime() - new Date(a.later.receivedAt).getTime() || a.x.code.localeCompare(b.x.code))
    .map(({ x, later, earlier }) => ({
      unitNumber: later.unitNumber, customer: later.customer, code: x.code,
      firstCall: earlier.number, repeatCall: later.number, days: Math.round(x.days * 10) / 10,
    }))
}

/**
 * Per mechanic and week (ISO, Monday first) of the local day the call was finished: calls finished,
 * first-visit fixes (repaired at the roadside, and the unit did not come back with the same code
 * within the comeback window: common practice for "first-time fix"), invoiced before tax for those
 * calls (sent or paid invoices), and hours on the work clock by the week the work started (a span
 * from a work start to the next work stop or departure, as billing pairs them; clock times the
 * server flagged are left out, as billing leaves them out).
 */
async function mechanicWeekRows(r: Ctx) {
  const { found } = await comebacksAround(r, COMEBACK_WINDOW_DAYS + 1, COMEBACK_WINDOW_DAYS + 1)
  // A Postgres array literal of call ids (uuids from the database, nothing typed by a person).
  const cameBack = `{${[...new Set(found.map(x => x.earlierCallId))].join(',')}}`
  const week = (day: SQL) => sql`date_trunc('week', ${day})::date`
  const res = await useDb().execute(sql`
    WITH done AS (
      SELECT c.id, c.mechanic_id, c.outcome, ${localDay(reached('completed', 'completed_at'), r.zone)} AS day
      FROM calls c WHERE c.mechanic_id IS NOT NULL AND c.outcome IS NOT NULL
    ), finished AS (
      SELECT mechanic_id, ${week(sql`day`)} AS week, count(*)::int AS finished,
        count(*) FILTER (WHERE outcome = 'repaired' AND NOT (id = ANY(${cameBack}::uuid[])))::int AS fixes
      FROM done WHERE ${inRange(sql`day`, r)} GROUP BY 1, 2
    ), revenue AS (
      SELECT d.mechanic_id, ${week(sql`d.day`)} AS week, sum(i.subtotal_cents)::int AS cents
      FROM done d JOIN invoices i ON i.call_id = d.id AND i.status IN ('sent', 'paid')
      WHERE ${inRange(sql`d.day`, r)} GROUP BY 1, 2
    ), ev AS (
      SELECT ce.call_id, c.mechanic_id, ce.kind, coalesce(ce.device_at, ce.created_at) AS at,
        lag(ce.kind) OVER (PARTITION BY ce.call_id ORDER BY coalesce(ce.device_at, ce.created_at)) AS prev
      FROM clock_events ce JOIN calls c ON c.id = ce.call_id
      WHERE ce.flag IS NULL AND ce.kind IN ('work_start', 'work_stop', 'depart') AND c.mechanic_id IS NOT NULL
    ), labor AS (
      SELECT s.mechanic_id, ${week(localDay(sql`s.at`, r.zone))} AS week, sum(extract(epoch FROM e.at - s.at)) / 3600 AS hours
      FROM ev s CROSS JOIN LATERAL (
        SELECT min(x.at) AS at FROM ev x WHERE x.call_id = s.call_id AND x.kind IN ('work_stop', 'depart') AND x.at > s.at
      ) e
      WHERE s.kind = 'work_start' AND (s.prev IS NULL OR s.prev <> 'work_start') AND e.at IS NOT NULL
        AND ${inRange(localDay(sql`s.at`, r.zone), r)}
      GROUP BY 1, 2
    ), weeks AS (
      SELECT mechanic_id, week FROM finished UNION SELECT mechanic_id, week FROM revenue UNION SELECT mechanic_id, week FROM labor
    )
    SELECT to_char(w.week, 'YYYY-MM-DD') AS week, u.name AS mechanic, coalesce(f.finished, 0) AS finished,
      coalesce(f.fixes, 0) AS "firstVisitFixes",
      round(100.0 * f.fixes / nullif(f.finished, 0), 1)::float AS "firstVisitFixPct",
      coalesce(rv.cents, 0) AS "revenueCents", round(coalesce(l.hours, 0)::numeric, 1)::float AS "laborHours"
    FROM weeks w JOIN users u ON u.id = w.mechanic_id
      LEFT JOIN finished f ON f.mechanic_id = w.mechanic_id AND f.week = w.week
      LEFT JOIN revenue rv ON rv.mechanic_id = w.mechanic_id AND rv.week = w.week
      LEFT JOIN labor l ON l.mechanic_id = w.mechanic_id AND l.week = w.week
    ORDER BY w.week, u.name`)
  return res.rows
}

export async function runReport(name: ReportName, range: ReportRange) {
  const r: Ctx = { ...range, zone: await businessZone() }
  let rows: unknown[]
  if (name === 'comebacks') rows = await comebackRows(r)
  else if (name === 'mechanic-weeks') rows = await mechanicWeekRows(r)
  else rows = (await useDb().execute(QUERIES[name](r))).rows
  return { from: r.from, to: r.to, rows: rows as Record<string, unknown>[] }
}

/** What a number column is counted in, said once in its CSV heading (cells stay bare numbers). */
const CSV_UNIT: Partial<Record<ReportColumnKind, string>> = { money: ' ($)', percent: ' (%)', hours: ' (h)' }

/** A report's CSV columns from the label registry: its headings, enum values as words, numbers as numbers. */
export function reportCsvColumns(name: ReportName): CsvColumn<Record<string, unknown>>[] {
  return REPORTS[name].columns.map((col) => {
    const header = col.label + (CSV_UNIT[col.kind] ?? '')
    if (col.words) return { header, kind: 'text' as const, value: r => reportCellText(col, r[col.key]) }
    const kind = col.kind === 'money' ? 'money' : isMeasureColumn(col) || col.kind === 'callNumber' ? 'number' : 'text'
    return { header, kind, value: r => r[col.key] }
  })
}
