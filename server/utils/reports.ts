import { sql } from 'drizzle-orm'
import type { ReportName, ReportRange } from '#shared/schemas/reports'

// Each report is one SQL query over [from, to] inclusive, in UTC days; answers `{ rows }`.
const range = (r: ReportRange, col: string) => sql`${sql.raw(col)} >= ${r.from}::date AND ${sql.raw(col)} < ${r.to}::date + 1`

const QUERIES: Record<ReportName, (r: ReportRange) => ReturnType<typeof sql>> = {
  'calls-per-day': r => sql`
    SELECT to_char(d, 'YYYY-MM-DD') AS day,
      count(c.id)::int AS received,
      count(c.id) FILTER (WHERE c.status IN ('completed', 'invoiced', 'paid'))::int AS completed,
      count(c.id) FILTER (WHERE c.status = 'cancelled')::int AS cancelled
    FROM generate_series(${r.from}::date, ${r.to}::date, interval '1 day') d
    LEFT JOIN calls c ON c.received_at >= d AND c.received_at < d + interval '1 day'
    GROUP BY d ORDER BY d`,
  'response-times': r => sql`
    SELECT to_char(date_trunc('day', received_at), 'YYYY-MM-DD') AS day, count(*)::int AS calls,
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM assigned_at - received_at) / 60)::numeric, 1)::float
        AS "medianToAssignMin",
      round(percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM on_site_at - received_at) / 60)::numeric, 1)::float
        AS "medianToArriveMin"
    FROM calls WHERE ${range(r, 'received_at')} AND assigned_at IS NOT NULL
    GROUP BY 1 ORDER BY 1`,
  'fix-rate': r => sql`
    SELECT outcome, count(*)::int AS calls,
      round(100.0 * count(*) / sum(count(*)) OVER (), 1)::float AS pct
    FROM calls WHERE ${range(r, 'completed_at')} AND outcome IS NOT NULL
    GROUP BY outcome ORDER BY calls DESC, outcome`,
  'comebacks': r => sql`
    WITH codes AS (
      SELECT c.unit_id, c.id AS call_id, c.number, c.received_at, coalesce(f.code, 'SPN ' || f.spn || ' FMI ' || f.fmi) AS code
      FROM fault_codes f JOIN calls c ON c.id = f.call_id WHERE c.unit_id IS NOT NULL
    )
    SELECT u.unit_number AS "unitNumber", cu.name AS customer, later.code,
      earlier.number AS "firstCall", later.number AS "repeatCall",
      round(extract(epoch FROM later.received_at - earlier.received_at)::numeric / 86400, 1)::float AS days
    FROM codes later
    JOIN codes earlier ON earlier.unit_id = later.unit_id AND earlier.code = later.code
      AND earlier.received_at < later.received_at AND later.received_at - earlier.received_at <= interval '30 days'
    JOIN units u ON u.id = later.unit_id JOIN customers cu ON cu.id = u.customer_id
    WHERE ${range(r, 'later.received_at')}
    ORDER BY later.received_at DESC`,
  'revenue': r => sql`
    SELECT to_char(date_trunc('day', i.created_at), 'YYYY-MM-DD') AS day, count(*)::int AS invoices,
      sum(i.total_cents)::int AS "totalCents",
      coalesce(sum(i.total_cents) FILTER (WHERE i.status = 'paid'), 0)::int AS "paidCents"
    FROM invoices i WHERE i.status <> 'void' AND ${range(r, 'i.created_at')}
    GROUP BY 1 ORDER BY 1`,
  'parts': r => sql`
    SELECT p.part_number AS "partNumber", min(p.description) AS description,
      sum(p.quantity)::float AS quantity, count(DISTINCT p.call_id)::int AS calls
    FROM part_lines p JOIN calls c ON c.id = p.call_id WHERE ${range(r, 'c.received_at')}
    GROUP BY p.part_number ORDER BY quantity DESC, "partNumber"`,
}

export async function runReport(name: ReportName, r: ReportRange) {
  const res = await useDb().execute(QUERIES[name](r))
  return { from: r.from, to: r.to, rows: res.rows }
}
