// Each report is SQL over [from, to] inclusive, in local days of the business's time zone; answers
// `{ from, to, rows }` with the columns the label registry (shared/utils/reportLabels.ts) names.
// When a call reached a status is read from its timeline (call_events.at: when it happened), the
// call's own column only for a call with no such event. Comebacks are found by the one rule in
// shared/utils/comeback.ts, the same the unit history uses; SQL only fetches the calls it reads.
// Ranges are read through indexes: a local-day range becomes a range of instants (inZone), and a
// call's finishing time is looked for where it can be (its timeline or its own column) before the
// exact rule is applied, so a year of a long history reads that year, not the history.
import { sql, type SQL } from 'drizzle-orm'
import type { ReportName, ReportRange } from '#shared/schemas/reports'
import { DONE_STATUSES, sqlStatusList } from '#shared/utils/callStatus'
import { COMEBACK_WINDOW_DAYS, findComebacks, type Comeback, type ComebackFaultCode } from '#shared/utils/comeback'
import { isMeasureColumn, REPORTS, reportCellText, type ReportColumnKind } from '#shared/utils/reportLabels'
import type { CsvColumn } from './csv'

export type ReportCtx = { from: string, to: string, zone: string }
type Ctx = ReportCtx

/** When the call first reached `status`, by its timeline; else the call's column. */
const reached = (status: 'assigned' | 'on_site' | 'completed', column: string) => sql`coalesce(
  (SELECT min(e.at) FROM call_events e WHERE e.call_id = c.id AND e.to_status = ${status}), ${sql.raw(`c.${column}`)})`
const localDay = (at: SQL, zone: string) => sql`(${at} AT TIME ZONE ${zone})::date`
const inRange = (day: SQL, r: Ctx) => sql`${day} BETWEEN ${r.from}::date AND ${r.to}::date`
/** `at` within the local days [from - before, to + after], as a range of instants an index on `at` can read. */
const inZone = (at: SQL, r: Ctx, before = 0, after = 0) => sql`(
  ${at} >= ((${r.from}::date - ${before}::int)::timestamp AT TIME ZONE ${r.zone})
  AND ${at} < ((${r.to}::date + 1 + ${after}::int)::timestamp AT TIME ZONE ${r.zone}))`
/**
 * Calls that first reached completed within the range (by reached()): found through the timeline's
 * completed moves in the range and the calls' own completed_at in the range, then checked exactly.
 */
// (= ANY(ARRAY(…)) reads those calls by their key; a plain IN lets the planner hash-join the whole table.)
const finishedIn = (r: Ctx) => sql`(
  SELECT c.id, c.mechanic_id, c.outcome, ${reached('completed', 'completed_at')} AS at FROM calls c
  WHERE c.id = ANY(ARRAY(SELECT e.call_id FROM call_events e WHERE e.to_status = 'completed' AND ${inZone(sql`e.at`, r)}
    UNION SELECT c2.id FROM calls c2 WHERE ${inZone(sql`c2.completed_at`, r)})))`

const QUERIES: Record<Exclude<ReportName, 'comebacks' | 'mechanic-weeks'>, (r: Ctx) => SQL> = {
  'calls-per-day': r => sql`
    WITH c AS (SELECT ${localDay(sql`received_at`, r.zone)} AS day, status FROM calls WHERE ${inZone(sql`received_at`, r)})
    SELECT to_char(d, 'YYYY-MM-DD') AS day,
      count(c.day)::int AS received,
      count(c.day) FILTER (WHERE c.status IN (${sql.raw(sqlStatusList(DONE_STATUSES))}))::int AS completed,
      count(c.day) FILTER (WHERE c.status = 'cancelled')::int AS cancelled
    FROM generate_series(${r.from}::date, ${r.to}::date, interval '1 day') d
    LEFT JOIN c ON c.day = d::date
    GROUP BY d ORDER BY d`,
  'response-times': r => sql`
    WITH t AS (
      -- reached() for both statuses in one read of each call's timeline.
      SELECT c.received_at, coalesce(ev.assigned, c.assigned_at) AS assigned, coalesce(ev.on_site, c.on_site_at) AS on_site
      FROM calls c CROSS JOIN LATERAL (
        SELECT min(e.at) FILTER (WHERE e.to_status = 'assigned') AS assigned, min(e.at) FILTER (WHERE e.to_status = 'on_site') AS on_site
        FROM call_events e WHERE e.call_id = c.id
      ) ev
      WHERE ${inZone(sql`c.received_at`, r)}
    )
    SELECT to_char(${localDay(sql`received_at`, r.zone)}, 'YYYY-MM-DD') AS day, count(*)::int AS calls,
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM assigned - received_at) / 60)::numeric, 1)::float
        AS "medianToAssignMin",
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM on_site - received_at) / 60)::numeric, 1)::float
        AS "medianToArriveMin"
    FROM t WHERE assigned IS NOT NULL
    GROUP BY 1 ORDER BY 1`,
  'fix-rate': r => sql`
    WITH done AS ${finishedIn(r)}
    SELECT outcome::text, count(*)::int AS calls,
      round(100.0 * count(*) / sum(count(*)) OVER (), 1)::float AS pct
    FROM done WHERE outcome IS NOT NULL AND ${inRange(localDay(sql`at`, r.zone), r)}
    GROUP BY outcome ORDER BY calls DESC, outcome`,
  'revenue': r => sql`
    SELECT to_char(${localDay(sql`i.sent_at`, r.zone)}, 'YYYY-MM-DD') AS day, count(*)::int AS invoices,
      sum(i.total_cents)::int AS "totalCents", sum(i.paid_cents)::int AS "paidCents"
    FROM invoices i WHERE i.status IN ('sent', 'paid') AND ${inZone(sql`i.sent_at`, r)}
    GROUP BY 1 ORDER BY 1`,
  'parts': r => sql`
    SELECT p.part_number AS "partNumber", min(p.description) AS description,
      sum(p.quantity)::float AS quantity, count(DISTINCT p.call_id)::int AS calls
    FROM part_lines p JOIN calls c ON c.id = p.call_id WHERE ${inZone(sql`c.received_at`, r)}
    GROUP BY p.part_number ORDER BY quantity DESC, "partNumber"`,
}

/** The calls (with their fault codes) received from `before` days ahead of the range to `after` days past it. */
export const comebackCallsSql = (r: Ctx, before: number, after: number) => sql`
    SELECT c.id, c.number, c.unit_id AS "unitId", c.received_at AS "receivedAt", u.unit_number AS "unitNumber", cu.name AS customer,
      coalesce(json_agg(json_build_object('code', f.code, 'spn', f.spn, 'fmi', f.fmi)) FILTER (WHERE f.id IS NOT NULL), '[]') AS codes
    FROM calls c JOIN units u ON u.id = c.unit_id JOIN customers cu ON cu.id = u.customer_id
      LEFT JOIN fault_codes f ON f.call_id = c.id
    WHERE ${inZone(sql`c.received_at`, r, before, after)}
    GROUP BY c.id, u.unit_number, cu.name`

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
  const res = await useDb().execute(comebackCallsSql(r, before, after))
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
  const res = await useDb().execute(mechanicWeeksSql(r, cameBack))
  return res.rows
}

const week = (day: SQL) => sql`date_trunc('week', ${day})::date`

/** The mechanic-weeks rows; `cameBack` is a Postgres array literal of the calls a comeback repeated. */
export const mechanicWeeksSql = (r: Ctx, cameBack: string) => sql`
    WITH done AS (
      SELECT f.id, f.mechanic_id, f.outcome, ${localDay(sql`f.at`, r.zone)} AS day
      FROM ${finishedIn(r)} f WHERE f.mechanic_id IS NOT NULL AND f.outcome IS NOT NULL
    ), finished AS (
      SELECT mechanic_id, ${week(sql`day`)} AS week, count(*)::int AS finished,
        count(*) FILTER (WHERE outcome = 'repaired' AND NOT (id = ANY(${cameBack}::uuid[])))::int AS fixes
      FROM done WHERE ${inRange(sql`day`, r)} GROUP BY 1, 2
    ), revenue AS (
      SELECT d.mechanic_id, ${week(sql`d.day`)} AS week, sum(i.subtotal_cents)::int AS cents
      FROM done d JOIN invoices i ON i.call_id = d.id AND i.status IN ('sent', 'paid')
      WHERE ${inRange(sql`d.day`, r)} GROUP BY 1, 2
    ), clocked AS (
      -- A week either side: the event before a start and the stop after it (a longer span is flagged, never billed).
      -- Each event's call is read by its key, not joined, so a year of events does not read every call. A
      -- start's end is the first work stop, departure or pause after it, found in the same pass (a window, not a
      -- search per start).
      SELECT ce.call_id, (SELECT c.mechanic_id FROM calls c WHERE c.id = ce.call_id) AS mechanic_id, ce.kind,
        coalesce(ce.device_at, ce.created_at) AS at,
        lag(ce.kind) OVER (PARTITION BY ce.call_id ORDER BY coalesce(ce.device_at, ce.created_at)) AS prev,
        min(coalesce(ce.device_at, ce.created_at)) FILTER (WHERE ce.kind IN ('work_stop', 'depart', 'pause')) OVER (
          PARTITION BY ce.call_id ORDER BY coalesce(ce.device_at, ce.created_at)
          RANGE BETWEEN CURRENT ROW AND UNBOUNDED FOLLOWING EXCLUDE GROUP) AS ends
      FROM clock_events ce
      WHERE ce.flag IS NULL AND ce.kind IN ('work_start', 'work_stop', 'depart', 'pause')
        AND ${inZone(sql`coalesce(ce.device_at, ce.created_at)`, r, 7, 7)}
    ), labor AS (
      SELECT s.mechanic_id, ${week(localDay(sql`s.at`, r.zone))} AS week, sum(extract(epoch FROM s.ends - s.at)) / 3600 AS hours
      FROM clocked s
      WHERE s.mechanic_id IS NOT NULL AND s.kind = 'work_start' AND (s.prev IS NULL OR s.prev <> 'work_start') AND s.ends IS NOT NULL
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
    ORDER BY w.week, u.name`

/** The SQL of a report that is one query. */
export const reportSql = (name: keyof typeof QUERIES, r: Ctx) => QUERIES[name](r)

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
