// The scale seed's statements: years of an invented road-call business, made inside PostgreSQL with
// generate_series (no rows cross the wire), so a hundred thousand calls load in well under two
// minutes. Sizes are parameters: `npm run seed:scale` loads the full history, the EXPLAIN test a
// smaller one. Every name, road and complaint is invented. Ids are made from the row's kind and
// number (scaleId), so a child row finds its call without a join and a second run sees the first.
import type pg from 'pg'
import { seedId } from './ids'

/** A code per kind of row, so each kind's ids are a range of their own. */
const KIND = {
  mech: 1, customer: 2, unit: 3, call: 4, event: 5, fault: 6, reading: 7, clock: 8, part: 9, note: 10, signoff: 11, invoice: 12,
  line: 13, payment: 14,
} as const

/**
 * The id of the n-th row of a kind (n a SQL expression): counting up, so rows go in at the right
 * edge of their key's index instead of at random places (a random UUID per row made the load four
 * times slower). They read as version-4 UUIDs; nothing takes meaning from an id.
 */
export function scaleId(kind: keyof typeof KIND, n: string) {
  return `('5ca1e0${KIND[kind].toString(16).padStart(2, '0')}-0000-4000-8000-' || lpad(to_hex(${n}), 12, '0'))::uuid`
}

export interface ScaleSize {
  calls: number
  units: number
  customers: number
  /** Mechanics made for the seed, besides the demo's (who get their share of the calls). */
  mechanics: number
  /** The span of the history, in days, ending now. */
  days: number
}

export const FULL_SCALE: ScaleSize = { calls: 100_000, units: 5_000, customers: 500, mechanics: 20, days: 4 * 365 }

/** The demo mechanics who take calls in the scale history too, so a demo sign-in sees it. */
const DEMO_MECHANICS = ['mech1', 'mech2', 'mech4'].map(k => seedId(`user:${k}`))

const arr = (xs: string[]) => `ARRAY[${xs.map(x => `'${x.replace(/'/g, '\'\'')}'`).join(', ')}]`

const PLACES = arr(['Prairie', 'Bluestem', 'Ironwood', 'Northgate', 'Cedar Run', 'Kettle River', 'Stonebridge', 'Larkspur',
  'Red Willow', 'Granite Flats', 'Marsh Hawk', 'Tamarack', 'Silver Coulee', 'Osprey Bay', 'Driftless', 'Hollow Oak',
  'Sandhill', 'Juniper Ridge', 'Wolf Creek', 'Bramble', 'Copper Lake', 'Fallow Field', 'High Plains', 'Birchwood', 'Eastmarch'])
const TRADES = arr(['Freight', 'Haulage', 'Carriers', 'Transport', 'Aggregates', 'Dairy Lines', 'Timber Hauling', 'Tank Lines',
  'Express', 'Grain Co-op', 'Waste Services', 'Moving', 'Bulk Carriers', 'Cold Chain', 'Paving', 'Readymix', 'Livestock',
  'Feed Mill', 'Auto Haul', 'Fuel Delivery'])
const FIRST = arr(['Ana', 'Bram', 'Cato', 'Dalia', 'Emeric', 'Freya', 'Gus', 'Hedda', 'Ivo', 'Jolene', 'Kasimir', 'Lio',
  'Mireille', 'Nils', 'Odile', 'Pavo', 'Quinn', 'Rasa', 'Soren', 'Tilde'])
const LAST = arr(['Ambrose', 'Birk', 'Castellane', 'Dunmore', 'Ekwueme', 'Faraday', 'Gravelle', 'Holmquist', 'Ingersoll',
  'Jaramillo', 'Kowalczyk', 'Lindahl', 'Marchbank', 'Nakagawa', 'Oyelaran', 'Pettersen', 'Quaresma', 'Rautio', 'Sandoval',
  'Thorsby'])
const ROADS = arr(['Route 8 eastbound shoulder', 'Highway 12 westbound ramp', 'County Road 4 at the quarry gate',
  'Interstate 94 rest area', 'Frontage road by the grain elevator', 'Truck stop fuel island 3', 'Customer yard, row B',
  'Drop lot behind the cold store', 'Highway 61 northbound shoulder', 'Industrial Parkway at Dock Street'])
const COMPLAINTS = arr(['Check-engine lamp on, will not pull over 50 km/h', 'No crank, dash lights dim',
  'DEF lamp flashing, countdown on the dash', 'Coolant temperature gauge reads cold with the engine warm',
  'Exhaust temperature fault, engine derated', 'Battery lamp on, voltage gauge low', 'Air pressure will not build past 80 psi',
  'Marker lamps out on the trailer', 'ABS lamp on after a pothole', 'Engine shut down on the hill, restarts then derates',
  'Oil pressure gauge drops at idle', 'Starter clicks, no turn'])
const CAUSES = arr(['Chafed harness shorted to ground at the frame', 'Sensor open circuit, connector pin backed out',
  'Alternator output low under load', 'Air dryer purge valve stuck open', 'Corroded ground strap at the block',
  'Failed coolant temperature sensor, out of table at 20 °C'])
const CORRECTIONS = arr(['Repaired wire, added loom, cleared codes, road tested', 'Replaced sensor, verified in live data, road tested',
  'Replaced alternator, output verified under load', 'Replaced purge valve, build-up time verified',
  'Cleaned and replaced ground strap, voltage drop verified', 'Replaced part, cleared codes, drive cycle completed'])
const SENSORS = arr(['Coolant temperature sensor', 'Intake air temperature sensor', 'Exhaust temperature sensor 1',
  'Battery', 'Alternator', 'Rail pressure sensor', 'Wheel speed sensor LF', 'Air dryer heater'])
const PARTS = arr(['WS-1001|Coolant temperature sensor', 'WS-1002|Exhaust temperature sensor', 'WS-2001|Alternator, 160 A',
  'WS-3001|Wheel speed sensor', 'WS-4001|Fuse, 30 A', 'WS-5001|Air dryer purge valve', 'WS-6001|Battery, group 31',
  'WS-7001|Harness repair kit'])
/** SPN/FMI pairs from SAE J1939-71/-73 numbering, used as typical codes (values from memory). */
const SPNS = 'ARRAY[110, 3251, 4364, 168, 100, 157, 1761, 3031, 5246, 94]'

/** Statements that load `size` (in order; run in one transaction). */
export function scaleStatements(size: ScaleSize): string[] {
  const { calls: N, units: U, customers: C, mechanics: M, days } = size
  // The demo's mechanics that are there (none in a database without the demo seed).
  const demo = `ARRAY(SELECT id FROM users WHERE id IN (${DEMO_MECHANICS.map(id => `'${id}'::uuid`).join(', ')}) ORDER BY id)`
  const id = (kind: keyof typeof KIND, n: string) => scaleId(kind, n)
  const pick = (list: string, n: string) => `(${list})[1 + (${n}) % array_length(${list}, 1)]`
  return [
    `INSERT INTO users (id, email, name, role, password_hash, on_duty)
     SELECT ${id('mech', 'g')}, 'scale-mech-' || g || '@wayside.test', ${pick(FIRST, 'g')} || ' ' || ${pick(LAST, 'g * 7')},
       'mechanic', coalesce((SELECT password_hash FROM users WHERE id = '${DEMO_MECHANICS[0]}'), '!no sign-in'), g % 4 <> 0
     FROM generate_series(1, ${M}) g`,
    `INSERT INTO customers (id, name, kind, billing_terms, net_days, billing_email, phone)
     SELECT ${id('customer', 'g')}, ${pick(PLACES, 'g')} || ' ' || ${pick(TRADES, 'g / 25')} || CASE WHEN g > 500 THEN ' ' || g ELSE '' END,
       CASE WHEN g % 9 = 0 THEN 'owner_operator' ELSE 'fleet' END,
       CASE WHEN g % 3 = 0 THEN 'account'::billing_terms ELSE 'card'::billing_terms END, CASE WHEN g % 3 = 0 THEN 30 END,
       'accounts' || g || '@fleet.example', '555-01' || lpad((g % 100)::text, 2, '0')
     FROM generate_series(1, ${C}) g`,
    `INSERT INTO units (id, customer_id, unit_number, vin, year_make_model, engine, odometer, odometer_unit)
     SELECT ${id('unit', 'g')}, ${id('customer', `(1 + (g - 1) % ${C})`)}, 'S' || lpad(g::text, 5, '0'),
       upper(substr(md5('vin' || g), 1, 17)),
       (2010 + g % 14) || ' ' || ${pick(arr(['Class 8 tractor', 'Class 8 day cab', 'Tandem dump', 'Straight truck', 'Tank tractor']), 'g')},
       ${pick(arr(['Diesel 13 L', 'Diesel 15 L', 'Diesel 11 L', 'Diesel 9 L']), 'g')}, 100000 + (g * 7919) % 900000, 'km'
     FROM generate_series(1, ${U}) g`,
    // One row per call with everything its children need; dropped at commit.
    `CREATE TEMP TABLE scale_calls ON COMMIT DROP AS
     WITH base AS (
       SELECT g AS n, ${id('call', 'g')} AS id, 1 + (g * 7919) % ${U} AS u,
         now() - make_interval(secs => (${N} - g)::float8 / ${N} * ${days} * 86400 + 60) AS received_at,
         ${`(${demo} || ARRAY(SELECT ${id('mech', 's')} FROM generate_series(1, ${M}) s))`} AS mechs
       FROM generate_series(1, ${N}) g
     ), aged AS (
       SELECT b.*, extract(epoch FROM now() - b.received_at) / 3600 AS age_h FROM base b
     )
     SELECT n, id, ${id('unit', 'u')} AS unit_id, ${id('customer', `(1 + (u - 1) % ${C})`)} AS customer_id, received_at,
       CASE
         WHEN age_h < 4 THEN (ARRAY['received', 'assigned', 'en_route', 'on_site'])[1 + n % 4]
         WHEN n % 37 = 0 THEN 'cancelled'
         WHEN age_h < 72 THEN 'completed'
         WHEN age_h < 24 * 40 OR n % 10 = 0 THEN 'invoiced'
         ELSE 'paid'
       END::call_status AS status,
       mechs[1 + n % array_length(mechs, 1)] AS mechanic_id,
       received_at + make_interval(mins => 5 + n % 20) AS assigned_at
     FROM aged`,
    `UPDATE scale_calls SET mechanic_id = NULL WHERE status = 'received'`,
    'ALTER TABLE scale_calls ADD PRIMARY KEY (n)',
    `ALTER TABLE scale_calls ADD COLUMN on_site_at timestamptz, ADD COLUMN completed_at timestamptz, ADD COLUMN worked boolean,
       ADD COLUMN done boolean`,
    `UPDATE scale_calls SET
       on_site_at = CASE WHEN status NOT IN ('received', 'assigned', 'en_route', 'cancelled') 
         THEN assigned_at + make_interval(mins => 25 + n % 60) END,
       completed_at = CASE WHEN status IN ('completed', 'invoiced', 'paid') THEN assigned_at + make_interval(mins => 90 + n % 180) END,
       worked = status NOT IN ('received', 'assigned', 'en_route', 'cancelled'),
       done = status IN ('completed', 'invoiced', 'paid')`,
    `INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, lat, lon, complaint, lamps, derate, loaded,
       caller_name, caller_phone, po_number, mechanic_id, story_complaint, story_cause, story_correction, received_at, assigned_at,
       en_route_at, on_site_at, completed_at, invoiced_at, paid_at, cancelled_at, cancel_reason, status_changed_at, created_at)
     SELECT id, status,
       CASE WHEN done THEN (ARRAY['repaired', 'repaired', 'repaired', 'repaired', 'repaired', 'repaired', 'towed', 'parts_ordered',
         'repaired', 'no_fault_found'])[1 + n % 10]::call_outcome END,
       customer_id, unit_id, ${pick(ROADS, 'n')} || ', near mile ' || (n % 300), 44.5 + (n % 1000) / 1000.0, -93.5 + (n % 700) / 1000.0,
       ${pick(COMPLAINTS, 'n')}, CASE WHEN n % 3 = 0 THEN '["check_engine"]'::jsonb ELSE '[]'::jsonb END,
       CASE WHEN n % 5 = 0 THEN 'derated'::derate_state ELSE 'none'::derate_state END, n % 2 = 0,
       ${pick(FIRST, 'n * 3')}, '555-02' || lpad((n % 100)::text, 2, '0'), CASE WHEN n % 3 = 0 THEN 'PO-' || (40000 + n) END,
       mechanic_id,
       CASE WHEN done THEN ${pick(COMPLAINTS, 'n')} END, CASE WHEN done THEN ${pick(CAUSES, 'n')} END,
       CASE WHEN done THEN ${pick(CORRECTIONS, 'n')} END,
       received_at, CASE WHEN status <> 'received' THEN assigned_at END,
       CASE WHEN status NOT IN ('received', 'assigned') THEN assigned_at + interval '3 minutes' END, on_site_at, completed_at,
       CASE WHEN status IN ('invoiced', 'paid') THEN completed_at + interval '1 day' END,
       CASE WHEN status = 'paid' THEN completed_at + interval '12 days' END,
       CASE WHEN status = 'cancelled' THEN received_at + interval '20 minutes' END,
       CASE WHEN status = 'cancelled' THEN 'Driver got it going again' END,
       coalesce(completed_at, on_site_at, assigned_at, received_at), received_at
     FROM scale_calls ORDER BY n`,
    `INSERT INTO call_events (id, call_id, kind, from_status, to_status, mechanic_id, at)
     SELECT ${id('event', 'n * 4')}, id, 'status', NULL::call_status, 'received'::call_status, NULL::uuid, received_at FROM scale_calls
     UNION ALL SELECT ${id('event', 'n * 4 + 1')}, id, 'assigned', 'received', 'assigned', mechanic_id, assigned_at FROM scale_calls
       WHERE mechanic_id IS NOT NULL
     UNION ALL SELECT ${id('event', 'n * 4 + 2')}, id, 'status', 'en_route', 'on_site', mechanic_id, on_site_at
       FROM scale_calls WHERE worked
     UNION ALL SELECT ${id('event', 'n * 4 + 3')}, id, 'status', 'on_site', 'completed', mechanic_id, completed_at
       FROM scale_calls WHERE done`,
    `INSERT INTO fault_codes (id, call_id, created_by, device_at, spn, fmi, state, count)
     SELECT ${id('fault', 'c.n * 2 + k')}, c.id, c.mechanic_id, c.on_site_at + interval '10 minutes',
       (${SPNS})[1 + (c.n / 3 + k) % 10], (ARRAY[0, 1, 2, 3, 4, 5])[1 + (c.n + k) % 6],
       CASE WHEN k = 1 THEN 'active'::fault_state ELSE 'stored'::fault_state END, 1 + c.n % 3
     FROM scale_calls c CROSS JOIN LATERAL generate_series(1, 1 + c.n % 2) k WHERE c.worked`,
    `INSERT INTO readings (id, call_id, created_by, device_at, label, quantity, value, unit, component, pins, conditions, spec,
       verdict)
     SELECT ${id('reading', 'c.n * 16 + k')}, c.id, c.mechanic_id, c.on_site_at + make_interval(mins => 15 + k),
       ${pick(SENSORS, 'c.n + k')} || ' check ' || k,
       (ARRAY['resistance', 'voltage', 'temperature', 'pressure'])[1 + k % 4]::reading_quantity,
       round((1 + (c.n * 31 + k * 17) % 5000 / 100.0)::numeric, 2), (ARRAY['ohm', 'V', '°C', 'kPa'])[1 + k % 4],
       ${pick(SENSORS, 'c.n + k')}, 'A–B', CASE WHEN k % 2 = 0 THEN 'key off' ELSE 'running' END,
       '{"min": 1, "max": 40}'::jsonb, CASE WHEN (c.n + k) % 11 = 0 THEN 'high'::verdict ELSE 'pass'::verdict END
     FROM scale_calls c CROSS JOIN LATERAL generate_series(1, 8 + c.n % 7) k WHERE c.worked`,
    // Travel, arrival, work start and departure (billing closes the work span at the departure).
    `INSERT INTO clock_events (id, call_id, created_by, device_at, kind)
     SELECT ${id('clock', 'n * 4')}, id, mechanic_id, assigned_at + interval '3 minutes', 'travel_start'::clock_kind
       FROM scale_calls WHERE worked
     UNION ALL SELECT ${id('clock', 'n * 4 + 1')}, id, mechanic_id, on_site_at, 'arrive' FROM scale_calls WHERE worked
     UNION ALL SELECT ${id('clock', 'n * 4 + 2')}, id, mechanic_id, on_site_at + interval '5 minutes', 'work_start'
       FROM scale_calls WHERE worked
     UNION ALL SELECT ${id('clock', 'n * 4 + 3')}, id, mechanic_id, completed_at, 'depart' FROM scale_calls WHERE done`,
    `INSERT INTO part_lines (id, call_id, created_by, device_at, part_number, description, quantity, unit_price_cents)
     SELECT ${id('part', 'c.n * 2 + k')}, c.id, c.mechanic_id, c.completed_at - interval '30 minutes',
       split_part(${pick(PARTS, 'c.n + k')}, '|', 1),
       split_part(${pick(PARTS, 'c.n + k')}, '|', 2), 1 + k % 2, 2500 + (c.n % 40) * 500
     FROM scale_calls c CROSS JOIN LATERAL generate_series(1, 1 + c.n % 2) k WHERE c.done AND c.n % 3 <> 0`,
    `INSERT INTO notes (id, call_id, created_by, device_at, text)
     SELECT ${id('note', 'n')}, id, mechanic_id, on_site_at + interval '20 minutes', 'Driver says it started after the cold night'
     FROM scale_calls
     WHERE worked AND n % 4 = 0`,
    `INSERT INTO sign_offs (id, call_id, created_by, device_at, driver_name, signature)
     SELECT ${id('signoff', 'n')}, id, mechanic_id, completed_at, ${pick(FIRST, 'n * 5')} || ' ' || ${pick(LAST, 'n * 11')},
       'data:image/svg+xml;base64,PHN2ZyB4bWxucz0iaHR0cDovL3d3dy53My5vcmcvMjAwMC9zdmciLz4='
     FROM scale_calls WHERE done`,
    `INSERT INTO invoices (id, call_id, customer_id, status, subtotal_cents, tax_cents, total_cents, due_at, sent_at, paid_at, paid_cents)
     SELECT ${id('invoice', 'n')}, id, customer_id, CASE WHEN status = 'paid' THEN 'paid' ELSE 'sent' END::invoice_status,
       30000 + (n % 60) * 1000, (30000 + (n % 60) * 1000) / 20, (30000 + (n % 60) * 1000) + (30000 + (n % 60) * 1000) / 20,
       completed_at + interval '31 days', completed_at + interval '1 day',
       CASE WHEN status = 'paid' THEN completed_at + interval '12 days' END,
       CASE WHEN status = 'paid' THEN (30000 + (n % 60) * 1000) + (30000 + (n % 60) * 1000) / 20 ELSE 0 END
     FROM scale_calls WHERE status IN ('invoiced', 'paid')`,
    `INSERT INTO invoice_lines (id, invoice_id, sort, kind, description, quantity, unit_cents, amount_cents, taxable, key)
     SELECT ${id('line', 'n * 2')}, ${id('invoice', 'n')}, 1, 'labor'::invoice_line_kind, 'Roadside labor', 2, 9500, 19000, true, 'labor'
     FROM scale_calls WHERE status IN ('invoiced', 'paid')
     UNION ALL SELECT ${id('line', 'n * 2 + 1')}, ${id('invoice', 'n')}, 2, 'travel', 'Travel', 1, 11000 + (n % 60) * 1000,
       11000 + (n % 60) * 1000, true, 'travel'
     FROM scale_calls WHERE status IN ('invoiced', 'paid')`,
    `INSERT INTO payments (id, invoice_id, method, amount_cents, status, reference, received_on)
     SELECT ${id('payment', 'n')}, ${id('invoice', 'n')}, CASE WHEN n % 3 = 0 THEN 'check' ELSE 'card' END::payment_method,
       (30000 + (n % 60) * 1000) + (30000 + (n % 60) * 1000) / 20, CASE WHEN n % 3 = 0 THEN 'recorded' ELSE 'succeeded' END,
       CASE WHEN n % 3 = 0 THEN 'CHK-' || n END, (completed_at + interval '12 days')::date
     FROM scale_calls WHERE status = 'paid'`,
  ]
}

/** Tables the seed fills in bulk: their secondary indexes are rebuilt after the load. */
const LOADED_TABLES = ['calls', 'call_events', 'fault_codes', 'readings', 'clock_events', 'part_lines', 'notes', 'sign_offs', 'invoices',
  'invoice_lines', 'payments']

export interface ScaleCounts { calls: number, readings: number, units: number, customers: number }

/**
 * Loads the scale history into the database `client` is connected to, unless it is there already
 * (answers false then). One transaction; triggers and foreign-key checks are skipped when the role
 * may (the rows are made consistent here), then ANALYZE so the planner sees the new sizes. Without
 * the demo seed, the history's mechanics alone take the calls (and cannot sign in).
 */
export async function loadScale(client: pg.ClientBase, size: ScaleSize = FULL_SCALE, verbose = false): Promise<boolean> {
  const there = await client.query(`SELECT 1 FROM calls WHERE id = ${scaleId('call', '1')}`)
  if (there.rowCount) return false
  const superuser = (await client.query<{ s: boolean }>('SELECT rolsuper AS s FROM pg_roles WHERE rolname = current_user')).rows[0]?.s
  await client.query('BEGIN')
  try {
    await client.query('SET LOCAL synchronous_commit = off')
    if (superuser) await client.query('SET LOCAL session_replication_role = replica')
    await client.query('SET LOCAL maintenance_work_mem = \'256MB\'')
    // Indexes are built once after the rows are in (sorted, far quicker than row by row); keys stay.
    const { rows: indexes } = await client.query<{ name: string, def: string }>(`SELECT indexname AS name, indexdef AS def
      FROM pg_indexes WHERE schemaname = current_schema() AND tablename = ANY($1)
        AND indexname NOT IN (SELECT conname FROM pg_constraint)`, [LOADED_TABLES])
    for (const ix of indexes) await client.query(`DROP INDEX "${ix.name}"`)
    for (const statement of scaleStatements(size)) {
      const t = performance.now()
      await client.query(statement)
      if (verbose) console.log(`  ${(performance.now() - t).toFixed(0)} ms  ${statement.trim().split('\n')[0]!.slice(0, 80)}`)
    }
    const t = performance.now()
    for (const ix of indexes) await client.query(ix.def)
    if (verbose) console.log(`  ${(performance.now() - t).toFixed(0)} ms  ${indexes.length} indexes built`)
    await client.query('COMMIT')
  }
  catch (err) {
    await client.query('ROLLBACK')
    throw err
  }
  // The planner's sizes; calls also vacuumed, so counting them can read an index alone.
  await client.query('VACUUM ANALYZE calls')
  await client.query('ANALYZE')
  return true
}

export async function scaleCounts(client: pg.ClientBase): Promise<ScaleCounts> {
  const { rows } = await client.query<ScaleCounts>(`SELECT (SELECT count(*) FROM calls)::int AS calls,
    (SELECT count(*) FROM readings)::int AS readings, (SELECT count(*) FROM units)::int AS units,
    (SELECT count(*) FROM customers)::int AS customers`)
  return rows[0]!
}
