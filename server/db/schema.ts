// Wayside's whole data model. Rows the device syncs carry a UUID key the device may make,
// `version` and `updatedAt` (both set by the `wayside_touch` trigger, never by the device) and
// `changeXid`, the writing transaction's id, which drives incremental pull (see server/utils/sync/pull.ts).
// Enums take their values from the shared lists the schemas and rules use.
import { relations, sql } from 'drizzle-orm'
import {
  bigint, boolean, check, customType, date, doublePrecision, index, integer, jsonb, pgEnum, pgTable,
  serial, text, timestamp, uniqueIndex, uuid,
} from 'drizzle-orm/pg-core'
import { CALL_OUTCOMES, CALL_STATUSES, DONE_STATUSES, sqlStatusList } from '../../shared/utils/callStatus'
import { ROLES } from '../../shared/utils/roles'
import { DERATE_STATES } from '../../shared/schemas/calls'
import { CLOCK_FLAGS } from '../../shared/sync/clockBounds'
import { CLOCK_KINDS, FAULT_STATES, READING_QUANTITIES } from '../../shared/schemas/syncRecords'
import { SYNC_OP_STATUSES } from '../../shared/schemas/sync'
import { APPROVAL_CHANNELS, APPROVAL_DECISIONS, DECLINE_CHOICES, type PlannedPart } from '../../shared/schemas/approvals'
import type { SignedLine } from '../../shared/schemas/estimateSignature'

const xid8 = customType<{ data: string }>({ dataType: () => 'xid8' })

const ts = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

/** Columns every synced row has. Defaults cover inserts the trigger does not see in tests. */
const synced = {
  version: integer('version').notNull().default(1),
  createdAt: ts('created_at').notNull().defaultNow(),
  updatedAt: ts('updated_at').notNull().defaultNow(),
  changeXid: xid8('change_xid').notNull().default(sql`pg_current_xact_id()`),
}

export const roleEnum = pgEnum('role', ROLES)
export const callStatusEnum = pgEnum('call_status', CALL_STATUSES)
export const callOutcomeEnum = pgEnum('call_outcome', CALL_OUTCOMES)
export const billingTermsEnum = pgEnum('billing_terms', ['card', 'account'])
export const derateEnum = pgEnum('derate_state', DERATE_STATES)
export const quantityEnum = pgEnum('reading_quantity', READING_QUANTITIES)
export const verdictEnum = pgEnum('verdict', ['pass', 'low', 'high'])
export const clockKindEnum = pgEnum('clock_kind', CLOCK_KINDS)
export const faultStateEnum = pgEnum('fault_state', FAULT_STATES)
export const invoiceStatusEnum = pgEnum('invoice_status', ['draft', 'sent', 'paid', 'void'])
export const invoiceLineKindEnum = pgEnum('invoice_line_kind', ['labor', 'travel', 'minimum', 'part', 'core', 'fee'])
export const paymentMethodEnum = pgEnum('payment_method', ['card', 'account', 'check', 'bank_transfer', 'cash'])
export const syncOpStatusEnum = pgEnum('sync_op_status', SYNC_OP_STATUSES)
export const conflictStatusEnum = pgEnum('conflict_status', ['open', 'resolved'])

// ── People ────────────────────────────────────────────────────────────────────────────────
export const users = pgTable('users', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  role: roleEnum('role').notNull(),
  passwordHash: text('password_hash').notNull(),
  active: boolean('active').notNull().default(true),
  phone: text('phone'),
  onDuty: boolean('on_duty').notNull().default(true),
  lastLat: doublePrecision('last_lat'),
  lastLon: doublePrecision('last_lon'),
  lastPositionAt: ts('last_position_at'),
  homeTruckId: uuid('home_truck_id'),
  ...synced,
}, t => [
  uniqueIndex('users_email_unique').on(sql`lower(${t.email})`),
  check('users_lat_range', sql`${t.lastLat} IS NULL OR ${t.lastLat} BETWEEN -90 AND 90`),
  check('users_lon_range', sql`${t.lastLon} IS NULL OR ${t.lastLon} BETWEEN -180 AND 180`),
])

/**
 * Sign-in tries reserved per key (`acct:<email>|<ip>` or `ip:<ip>`) within a window that starts at
 * the first try; `lockedUntil` is the pause after a key used up its bound (server/utils/loginLimiter.ts).
 */
export const loginAttempts = pgTable('login_attempts', {
  key: text('key').primaryKey(),
  failures: integer('failures').notNull().default(0),
  lastFailureAt: ts('last_failure_at').notNull().defaultNow(),
  lockedUntil: ts('locked_until'),
  windowStartedAt: ts('window_started_at').notNull().defaultNow(),
})

/**
 * Each person's session epoch, sealed into their session cookie at sign-in and compared on every
 * request: signing out or a new password moves it on, which ends every session made before.
 */
export const sessionEpochs = pgTable('session_epochs', {
  userId: uuid('user_id').primaryKey().references(() => users.id, { onDelete: 'cascade' }),
  epoch: integer('epoch').notNull().default(0),
  changedAt: ts('changed_at').notNull().defaultNow(),
})

// ── Our business ──────────────────────────────────────────────────────────────────────────
export const yards = pgTable('yards', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  address: text('address').notNull(),
  lat: doublePrecision('lat').notNull(),
  lon: doublePrecision('lon').notNull(),
  ...synced,
})

export const serviceTrucks = pgTable('service_trucks', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  plate: text('plate'),
  yardId: uuid('yard_id').references(() => yards.id),
  active: boolean('active').notNull().default(true),
  ...synced,
}, t => [uniqueIndex('service_trucks_name_unique').on(t.name)])

export const truckStock = pgTable('truck_stock', {
  id: uuid('id').primaryKey().defaultRandom(),
  truckId: uuid('truck_id').notNull().references(() => serviceTrucks.id),
  partNumber: text('part_number').notNull(),
  description: text('description').notNull(),
  /** On hand. Below zero when the mechanics used more than the count said: a flag to count again. */
  quantity: doublePrecision('quantity').notNull().default(0),
  unitPriceCents: integer('unit_price_cents').notNull(),
  coreChargeCents: integer('core_charge_cents').notNull().default(0),
  bin: text('bin'),
  /** Restock when on hand falls below this. */
  minimum: doublePrecision('minimum').notNull().default(0),
  costCents: integer('cost_cents').notNull().default(0),
  ...synced,
}, t => [
  uniqueIndex('truck_stock_part_unique').on(t.truckId, t.partNumber),
  check('truck_stock_price_nonneg', sql`${t.unitPriceCents} >= 0 AND ${t.coreChargeCents} >= 0`),
  check('truck_stock_minimum_cost', sql`${t.minimum} >= 0 AND ${t.costCents} >= 0`),
])

/**
 * Every change to a truck's stock, append-only: a synced part line taking parts off (written by
 * the `wayside_take_stock` trigger on part_lines, once per part line), a count corrected, a
 * transfer between trucks, a line added. Who, when, before and after, and why.
 */
export const stockMoves = pgTable('stock_moves', {
  id: uuid('id').primaryKey().defaultRandom(),
  truckId: uuid('truck_id').notNull().references(() => serviceTrucks.id),
  stockId: uuid('stock_id').references(() => truckStock.id),
  partNumber: text('part_number').notNull(),
  kind: text('kind').notNull(),
  delta: doublePrecision('delta').notNull(),
  before: doublePrecision('before'),
  after: doublePrecision('after'),
  /** Parts used beyond what was on hand (or on a truck that does not stock the part). */
  shortfall: doublePrecision('shortfall').notNull().default(0),
  reason: text('reason'),
  partLineId: uuid('part_line_id').references(() => partLines.id, { onDelete: 'set null' }),
  callId: uuid('call_id').references(() => calls.id, { onDelete: 'set null' }),
  /** Both halves of a transfer share it. */
  transferId: uuid('transfer_id'),
  byUserId: uuid('by_user_id').references(() => users.id),
  at: ts('at').notNull().defaultNow(),
}, t => [
  uniqueIndex('stock_moves_part_line_unique').on(t.partLineId),
  index('stock_moves_truck_idx').on(t.truckId, t.at),
  index('stock_moves_stock_idx').on(t.stockId, t.at),
  check('stock_moves_kind', sql`${t.kind} IN ('used', 'count', 'transfer_out', 'transfer_in', 'added')`),
  check('stock_moves_shortfall', sql`${t.shortfall} >= 0`),
])

/** The admin's rates; the newest row by `effectiveFrom` is in force. */
export const rates = pgTable('rates', {
  id: uuid('id').primaryKey().defaultRandom(),
  laborCentsPerHour: integer('labor_cents_per_hour').notNull(),
  afterHoursMultiplierPct: integer('after_hours_multiplier_pct').notNull().default(150),
  minimumLaborTenths: integer('minimum_labor_tenths').notNull().default(10),
  roadCallMinimumCents: integer('road_call_minimum_cents').notNull().default(0),
  travelCentsPerUnit: integer('travel_cents_per_unit').notNull(),
  travelUnit: text('travel_unit').notNull().default('km'),
  partsMarkupPct: integer('parts_markup_pct').notNull().default(0),
  taxRateBasisPoints: integer('tax_rate_basis_points').notNull().default(0),
  laborTaxable: boolean('labor_taxable').notNull().default(false),
  averageRoadKph: integer('average_road_kph').notNull().default(70),
  // Defaults reproduce the prices of rates set before these settings existed.
  travelBasis: text('travel_basis').notNull().default('distance'),
  travelCentsPerHour: integer('travel_cents_per_hour').notNull().default(0),
  roadFactorPct: integer('road_factor_pct').notNull().default(100),
  travelTaxable: boolean('travel_taxable').notNull().default(false),
  partsTaxable: boolean('parts_taxable').notNull().default(true),
  coresTaxable: boolean('cores_taxable').notNull().default(false),
  feesTaxable: boolean('fees_taxable').notNull().default(false),
  shopSuppliesBasisPoints: integer('shop_supplies_basis_points').notNull().default(0),
  shopSuppliesCapCents: integer('shop_supplies_cap_cents'),
  environmentalFeeCents: integer('environmental_fee_cents').notNull().default(0),
  timeZone: text('time_zone').notNull().default('UTC'),
  openMinute: integer('open_minute').notNull().default(0),
  closeMinute: integer('close_minute').notNull().default(1440),
  openDays: jsonb('open_days').$type<number[]>().notNull().default([1, 2, 3, 4, 5, 6, 7]),
  holidays: jsonb('holidays').$type<string[]>().notNull().default([]),
  // The business as its invoices print it.
  businessName: text('business_name').notNull().default(''),
  businessPhone: text('business_phone').notNull().default(''),
  businessEmail: text('business_email').notNull().default(''),
  remitAddress: text('remit_address').notNull().default(''),
  /** How many days a fleet's status link stays open at most (it also closes when the call is paid). */
  statusLinkDays: integer('status_link_days').notNull().default(14),
  /** Minutes an assignment may wait for the mechanic to set off before the dispatch board turns it red. */
  assignmentAlarmMinutes: integer('assignment_alarm_minutes').notNull().default(10),
  effectiveFrom: ts('effective_from').notNull().defaultNow(),
  ...synced,
}, t => [
  check('rates_travel_unit', sql`${t.travelUnit} IN ('km', 'mi')`),
  check('rates_nonneg', sql`${t.laborCentsPerHour} >= 0 AND ${t.travelCentsPerUnit} >= 0 AND ${t.partsMarkupPct} >= 0 AND ${
    sql`${t.taxRateBasisPoints} >= 0 AND ${t.averageRoadKph} > 0`}`),
  check('rates_travel_basis', sql`${t.travelBasis} IN ('distance', 'time')`),
  check('rates_hours', sql`${t.openMinute} BETWEEN 0 AND 1440 AND ${t.closeMinute} BETWEEN 0 AND 1440`),
  check('rates_status_link_days', sql`${t.statusLinkDays} BETWEEN 1 AND 90`),
  check('rates_assignment_alarm', sql`${t.assignmentAlarmMinutes} BETWEEN 1 AND 240`),
  check('rates_fees_nonneg', sql`${t.travelCentsPerHour} >= 0 AND ${t.shopSuppliesBasisPoints} >= 0 AND ${
    sql`${t.environmentalFeeCents} >= 0 AND ${t.roadFactorPct} >= 100`}`),
])

// ── Fleets and units ──────────────────────────────────────────────────────────────────────
export const customers = pgTable('customers', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  kind: text('kind').notNull().default('fleet'),
  billingTerms: billingTermsEnum('billing_terms').notNull().default('card'),
  netDays: integer('net_days'),
  billingEmail: text('billing_email'),
  phone: text('phone'),
  taxExempt: boolean('tax_exempt').notNull().default(false),
  notes: text('notes'),
  ...synced,
}, t => [
  index('customers_name_idx').on(t.name),
  check('customers_kind', sql`${t.kind} IN ('fleet', 'owner_operator')`),
  check('customers_net_days', sql`${t.netDays} IS NULL OR ${t.netDays} BETWEEN 0 AND 180`),
])

/** A customer's own yards and drop lots, offered as pick-list locations when taking a call. */
export const customerSites = pgTable('customer_sites', {
  id: uuid('id').primaryKey().defaultRandom(),
  customerId: uuid('customer_id').notNull().references(() => customers.id),
  name: text('name').notNull(),
  address: text('address'),
  lat: doublePrecision('lat').notNull(),
  lon: doublePrecision('lon').notNull(),
  ...synced,
}, t => [index('customer_sites_customer_idx').on(t.customerId)])

export const units = pgTable('units', {
  id: uuid('id').primaryKey().defaultRandom(),
  customerId: uuid('customer_id').notNull().references(() => customers.id),
  unitNumber: text('unit_number').notNull(),
  vin: text('vin'),
  vinOverrideReason: text('vin_override_reason'),
  yearMakeModel: text('year_make_model'),
  engine: text('engine'),
  odometer: integer('odometer'),
  odometerUnit: text('odometer_unit').notNull().default('km'),
  engineHours: doublePrecision('engine_hours'),
  notes: text('notes'),
  ...synced,
}, t => [
  index('units_customer_idx').on(t.customerId),
  index('units_vin_idx').on(t.vin),
  uniqueIndex('units_customer_number_unique').on(t.customerId, t.unitNumber),
  check('units_odometer_unit', sql`${t.odometerUnit} IN ('km', 'mi')`),
  check('units_nonneg', sql`(${t.odometer} IS NULL OR ${t.odometer} >= 0) AND (${t.engineHours} IS NULL OR ${t.engineHours} >= 0)`),
])

// ── Calls ─────────────────────────────────────────────────────────────────────────────────
export const calls = pgTable('calls', {
  id: uuid('id').primaryKey().defaultRandom(),
  number: serial('number').notNull(),
  status: callStatusEnum('status').notNull().default('received'),
  outcome: callOutcomeEnum('outcome'),
  customerId: uuid('customer_id').notNull().references(() => customers.id),
  unitId: uuid('unit_id').references(() => units.id),
  locationText: text('location_text').notNull(),
  lat: doublePrecision('lat'),
  lon: doublePrecision('lon'),
  complaint: text('complaint').notNull(),
  lamps: jsonb('lamps').$type<string[]>().notNull().default([]),
  derate: derateEnum('derate').notNull().default('none'),
  derateNote: text('derate_note'),
  loaded: boolean('loaded').notNull().default(false),
  hazmat: boolean('hazmat').notNull().default(false),
  safetyNotes: text('safety_notes'),
  callerName: text('caller_name'),
  callerPhone: text('caller_phone'),
  poNumber: text('po_number'),
  authLimitCents: integer('auth_limit_cents'),
  mechanicId: uuid('mechanic_id').references(() => users.id),
  serviceTruckId: uuid('service_truck_id').references(() => serviceTrucks.id),
  // Field-work fields, written by the mechanic through sync.
  storyComplaint: text('story_complaint'),
  storyCause: text('story_cause'),
  storyCorrection: text('story_correction'),
  sceneChecklist: jsonb('scene_checklist').$type<Record<string, boolean>>(),
  verification: jsonb('verification').$type<Record<string, unknown>>(),
  followUp: text('follow_up'),
  /** What the mechanic chose after the fleet declined more work (make safe and release, tow, stop). */
  afterDecline: text('after_decline'),
  /** Read at the truck on arrival (the unit's odometer unit); the unit's own is raised to it, never lowered. */
  odometerReading: integer('odometer_reading'),
  engineHoursReading: doublePrecision('engine_hours_reading'),
  cancelReason: text('cancel_reason'),
  receivedAt: ts('received_at').notNull().defaultNow(),
  assignedAt: ts('assigned_at'),
  enRouteAt: ts('en_route_at'),
  onSiteAt: ts('on_site_at'),
  completedAt: ts('completed_at'),
  invoicedAt: ts('invoiced_at'),
  paidAt: ts('paid_at'),
  cancelledAt: ts('cancelled_at'),
  statusChangedAt: ts('status_changed_at').notNull().defaultNow(),
  createdBy: uuid('created_by').references(() => users.id),
  ...synced,
}, t => [
  uniqueIndex('calls_number_unique').on(t.number),
  index('calls_status_idx').on(t.status),
  index('calls_mechanic_idx').on(t.mechanicId, t.status),
  index('calls_customer_idx').on(t.customerId),
  index('calls_unit_idx').on(t.unitId),
  index('calls_change_idx').on(t.changeXid),
  // The list's sort keys, each with the number that breaks ties (and the id, so a deep page reads the index alone).
  index('calls_received_idx').on(t.receivedAt, t.number, t.id),
  index('calls_status_received_idx').on(t.status, t.receivedAt, t.number),
  index('calls_status_changed_idx').on(t.statusChangedAt, t.number),
  index('calls_unit_received_idx').on(t.unitId, t.receivedAt, t.number),
  index('calls_completed_idx').on(t.completedAt),
  // A mechanic's first pull: their recent calls by one range, and each unit's last few calls of theirs.
  index('calls_mechanic_recent_idx').on(t.mechanicId, sql`coalesce(assigned_at, received_at)`),
  index('calls_mechanic_unit_idx').on(t.mechanicId, t.unitId, t.receivedAt),
  check('calls_lat_range', sql`${t.lat} IS NULL OR ${t.lat} BETWEEN -90 AND 90`),
  check('calls_lon_range', sql`${t.lon} IS NULL OR ${t.lon} BETWEEN -180 AND 180`),
  check('calls_auth_limit_nonneg', sql`${t.authLimitCents} IS NULL OR ${t.authLimitCents} >= 0`),
  check('calls_truck_readings_nonneg',
    sql`(${t.odometerReading} IS NULL OR ${t.odometerReading} >= 0) AND (${t.engineHoursReading} IS NULL OR ${t.engineHoursReading} >= 0)`),
  check('calls_after_decline',
    sql`${t.afterDecline} IS NULL OR ${t.afterDecline} IN (${sql.raw(DECLINE_CHOICES.map(c => `'${c}'`).join(', '))})`),
  check('calls_outcome_when_done', sql`${t.outcome} IS NULL OR ${t.status} IN (${sql.raw(sqlStatusList(DONE_STATUSES))})`),
])

/** Every status move, for the timeline; append-only. */
export const callEvents = pgTable('call_events', {
  id: uuid('id').primaryKey().defaultRandom(),
  callId: uuid('call_id').notNull().references(() => calls.id),
  kind: text('kind').notNull(),
  fromStatus: callStatusEnum('from_status'),
  toStatus: callStatusEnum('to_status'),
  mechanicId: uuid('mechanic_id').references(() => users.id),
  byUserId: uuid('by_user_id').references(() => users.id),
  note: text('note'),
  at: ts('at').notNull().defaultNow(),
  ...synced,
}, t => [
  index('call_events_call_idx').on(t.callId, t.at),
  // When calls reached a status, for the reports.
  index('call_events_reached_idx').on(t.toStatus, t.at),
])

/** Columns of every append-only record the mechanic adds to a call. */
const callChild = {
  callId: uuid('call_id').notNull().references(() => calls.id),
  createdBy: uuid('created_by').references(() => users.id),
  deviceAt: ts('device_at'),
}

export const faultCodes = pgTable('fault_codes', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  code: text('code'),
  spn: integer('spn'),
  fmi: integer('fmi'),
  state: faultStateEnum('state').notNull().default('active'),
  count: integer('count').notNull().default(1),
  source: text('source'),
  clearedAt: ts('cleared_at'),
  note: text('note'),
  ...synced,
}, t => [
  index('fault_codes_call_idx').on(t.callId),
  index('fault_codes_change_idx').on(t.changeXid),
  check('fault_codes_form', sql`${t.code} IS NOT NULL OR (${t.spn} IS NOT NULL AND ${t.fmi} IS NOT NULL)`),
  check('fault_codes_spn_range', sql`${t.spn} IS NULL OR ${t.spn} BETWEEN 0 AND 524287`),
  check('fault_codes_fmi_range', sql`${t.fmi} IS NULL OR ${t.fmi} BETWEEN 0 AND 31`),
  check('fault_codes_count', sql`${t.count} >= 0 AND ${t.count} <= 127`),
])

export const testCards = pgTable('test_cards', {
  id: uuid('id').primaryKey().defaultRandom(),
  slug: text('slug').notNull(),
  title: text('title').notNull(),
  componentType: text('component_type').notNull(),
  currentVersion: integer('current_version').notNull().default(1),
  active: boolean('active').notNull().default(true),
  ...synced,
}, t => [uniqueIndex('test_cards_slug_unique').on(t.slug)])

export const testCardVersions = pgTable('test_card_versions', {
  id: uuid('id').primaryKey().defaultRandom(),
  cardId: uuid('card_id').notNull().references(() => testCards.id),
  cardVersion: integer('card_version').notNull(),
  definition: jsonb('definition').$type<Record<string, unknown>>().notNull(),
  authorId: uuid('author_id').references(() => users.id),
  ...synced,
}, t => [uniqueIndex('test_card_versions_unique').on(t.cardId, t.cardVersion)])

export const testRuns = pgTable('test_runs', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  cardId: uuid('card_id').notNull().references(() => testCards.id),
  cardVersion: integer('card_version').notNull(),
  ambientC: doublePrecision('ambient_c'),
  steps: jsonb('steps').$type<unknown[]>().notNull().default([]),
  conclusion: text('conclusion'),
  finishedAt: ts('finished_at'),
  ...synced,
}, t => [index('test_runs_call_idx').on(t.callId), index('test_runs_change_idx').on(t.changeXid)])

export const readings = pgTable('readings', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  testRunId: uuid('test_run_id').references(() => testRuns.id),
  stepId: text('step_id'),
  label: text('label').notNull(),
  quantity: quantityEnum('quantity').notNull(),
  value: doublePrecision('value').notNull(),
  unit: text('unit').notNull(),
  component: text('component'),
  pins: text('pins'),
  conditions: text('conditions'),
  partRole: text('part_role'),
  spec: jsonb('spec').$type<Record<string, unknown>>(),
  verdict: verdictEnum('verdict'),
  ...synced,
}, t => [
  index('readings_call_idx').on(t.callId),
  index('readings_change_idx').on(t.changeXid),
  check('readings_part_role', sql`${t.partRole} IS NULL OR ${t.partRole} IN ('installed', 'new')`),
])

export const notes = pgTable('notes', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  text: text('text').notNull(),
  ...synced,
}, t => [index('notes_call_idx').on(t.callId), index('notes_change_idx').on(t.changeXid)])

/** Photo metadata; the bytes live in Nitro storage under `storageKey` once uploaded. */
export const photos = pgTable('photos', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  caption: text('caption'),
  contentType: text('content_type'),
  sizeBytes: integer('size_bytes'),
  sha256: text('sha256'),
  storageKey: text('storage_key'),
  uploadedAt: ts('uploaded_at'),
  /** Set by the office: the photo goes on the invoice the customer receives. */
  showCustomer: boolean('show_customer').notNull().default(false),
  ...synced,
}, t => [index('photos_call_idx').on(t.callId), index('photos_change_idx').on(t.changeXid)])

export const clockEvents = pgTable('clock_events', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  kind: clockKindEnum('kind').notNull(),
  /**
   * Set by the server when the phone's clock cannot be trusted for this event (never billed): before_call,
   * future or long_span; null when trusted. device_at is the phone's time, created_at when the server learned it.
   */
  flag: text('flag'),
  ...synced,
}, t => [
  index('clock_events_call_idx').on(t.callId),
  index('clock_events_change_idx').on(t.changeXid),
  index('clock_events_at_idx').on(sql`coalesce(${t.deviceAt}, ${t.createdAt})`),
  check('clock_events_flag', sql`${t.flag} IS NULL OR ${t.flag} IN (${sql.raw(CLOCK_FLAGS.map(f => `'${f}'`).join(', '))})`),
])

export const partLines = pgTable('part_lines', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  partNumber: text('part_number').notNull(),
  description: text('description').notNull(),
  quantity: doublePrecision('quantity').notNull(),
  unitPriceCents: integer('unit_price_cents').notNull().default(0),
  coreChargeCents: integer('core_charge_cents').notNull().default(0),
  serviceTruckId: uuid('service_truck_id').references(() => serviceTrucks.id),
  ...synced,
}, t => [
  index('part_lines_call_idx').on(t.callId),
  index('part_lines_change_idx').on(t.changeXid),
  check('part_lines_quantity', sql`${t.quantity} > 0`),
  check('part_lines_prices', sql`${t.unitPriceCents} >= 0 AND ${t.coreChargeCents} >= 0`),
])

export const signOffs = pgTable('sign_offs', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  driverName: text('driver_name').notNull(),
  /** The drawn signature as an SVG or PNG data URL; small enough to keep in the row. */
  signature: text('signature').notNull(),
  ...synced,
}, t => [uniqueIndex('sign_offs_call_unique').on(t.callId), index('sign_offs_change_idx').on(t.changeXid)])

/** The mechanic asks the fleet for more: made on the phone, synced like any record; append-only. */
export const approvalRequests = pgTable('approval_requests', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  diagnosis: text('diagnosis').notNull(),
  needed: text('needed'),
  plannedLaborMinutes: integer('planned_labor_minutes').notNull().default(0),
  plannedParts: jsonb('planned_parts').$type<PlannedPart[]>().notNull().default([]),
  estimateCents: integer('estimate_cents').notNull(),
  limitCents: integer('limit_cents'),
  photoIds: jsonb('photo_ids').$type<string[]>().notNull().default([]),
  ...synced,
}, t => [
  index('approval_requests_call_idx').on(t.callId),
  index('approval_requests_change_idx').on(t.changeXid),
  check('approval_requests_money', sql`${t.estimateCents} >= 0 AND (${t.limitCents} IS NULL OR ${t.limitCents} >= 0)`),
])

/**
 * A card customer's driver signs the estimate before the work: made on the phone, synced like any
 * record, append-only (a new estimate above the signed amount takes a new signature, a new row).
 */
export const estimateSignatures = pgTable('estimate_signatures', {
  id: uuid('id').primaryKey().defaultRandom(),
  ...callChild,
  driverName: text('driver_name').notNull(),
  /** The drawn signature as a PNG data URL, as on the final sign-off. */
  signature: text('signature').notNull(),
  work: text('work').notNull(),
  plannedLaborMinutes: integer('planned_labor_minutes').notNull().default(0),
  plannedParts: jsonb('planned_parts').$type<PlannedPart[]>().notNull().default([]),
  /** The estimate's lines as the driver saw them. */
  lines: jsonb('lines').$type<SignedLine[]>().notNull().default([]),
  taxCents: integer('tax_cents').notNull(),
  amountCents: integer('amount_cents').notNull(),
  /** The phone's time of signing, kept between the call being taken and the server's now. */
  signedAt: ts('signed_at').notNull(),
  ...synced,
}, t => [
  index('estimate_signatures_call_idx').on(t.callId, t.signedAt),
  index('estimate_signatures_change_idx').on(t.changeXid),
  check('estimate_signatures_money', sql`${t.amountCents} >= 0 AND ${t.taxCents} >= 0`),
])

const quoted = (xs: readonly string[]) => sql.raw(xs.map(x => `'${x}'`).join(', '))
/** The fleet's answer: who, how much, which PO, how and when; written by the server only (the office or the fleet's link). */
export const approvals = pgTable('approvals', {
  id: uuid('id').primaryKey().defaultRandom(),
  callId: uuid('call_id').notNull().references(() => calls.id),
  /** The request it answers (the newest open one when it was recorded), if any. */
  requestId: uuid('request_id').references(() => approvalRequests.id),
  decision: text('decision').notNull(),
  approvedBy: text('approved_by').notNull(),
  amountCents: integer('amount_cents').notNull(),
  poNumber: text('po_number'),
  channel: text('channel').notNull(),
  decidedAt: ts('decided_at').notNull().defaultNow(),
  /** The office user who recorded it; null when the fleet answered on its own page. */
  recordedBy: uuid('recorded_by').references(() => users.id),
  linkId: uuid('link_id'),
  previousLimitCents: integer('previous_limit_cents'),
  previousPoNumber: text('previous_po_number'),
  ...synced,
}, t => [
  index('approvals_call_idx').on(t.callId, t.decidedAt),
  index('approvals_change_idx').on(t.changeXid),
  uniqueIndex('approvals_request_unique').on(t.requestId),
  uniqueIndex('approvals_link_unique').on(t.linkId),
  check('approvals_decision', sql`${t.decision} IN (${quoted(APPROVAL_DECISIONS)})`),
  check('approvals_channel', sql`${t.channel} IN (${quoted(APPROVAL_CHANNELS)})`),
  check('approvals_amount', sql`${t.amountCents} >= 0`),
])

// ── Billing ───────────────────────────────────────────────────────────────────────────────
export const invoices = pgTable('invoices', {
  id: uuid('id').primaryKey().defaultRandom(),
  number: serial('number').notNull(),
  callId: uuid('call_id').notNull().references(() => calls.id),
  customerId: uuid('customer_id').notNull().references(() => customers.id),
  status: invoiceStatusEnum('status').notNull().default('draft'),
  subtotalCents: integer('subtotal_cents').notNull().default(0),
  taxCents: integer('tax_cents').notNull().default(0),
  totalCents: integer('total_cents').notNull().default(0),
  ratesId: uuid('rates_id').references(() => rates.id),
  /** What the draft was priced from (shared/utils/billing.ts PricingInput without the office's changes). */
  pricingInput: jsonb('pricing_input').$type<Record<string, unknown>>(),
  dueAt: ts('due_at'),
  sentAt: ts('sent_at'),
  paidAt: ts('paid_at'),
  /** Money received that counts against the invoice, less refunds (kept by server/utils/payments.ts). */
  paidCents: integer('paid_cents').notNull().default(0),
  /** The credit notes' totals, as a positive amount. */
  creditedCents: integer('credited_cents').notNull().default(0),
  /** The payer's link to the payment page (`/pay/<token>`), made when first asked for. */
  payToken: text('pay_token'),
  ...synced,
}, t => [
  uniqueIndex('invoices_number_unique').on(t.number),
  uniqueIndex('invoices_pay_token_unique').on(t.payToken),
  index('invoices_call_idx').on(t.callId),
  index('invoices_status_idx').on(t.status),
  index('invoices_sent_idx').on(t.sentAt),
  check('invoices_totals', sql`${t.totalCents} = ${t.subtotalCents} + ${t.taxCents}`),
])

export const invoiceLines = pgTable('invoice_lines', {
  id: uuid('id').primaryKey().defaultRandom(),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id, { onDelete: 'cascade' }),
  sort: integer('sort').notNull().default(0),
  kind: invoiceLineKindEnum('kind').notNull(),
  description: text('description').notNull(),
  quantity: doublePrecision('quantity').notNull(),
  unitCents: integer('unit_cents').notNull(),
  amountCents: integer('amount_cents').notNull(),
  taxable: boolean('taxable').notNull(),
  /** The pricing's key for this line (labor, part:<id>, office:<id>…), which the office's changes name. */
  key: text('key'),
  /** Where the figures come from: clock event ids, the part line, the rate, or the office. */
  source: jsonb('source').$type<Record<string, unknown>>(),
}, t => [index('invoice_lines_invoice_idx').on(t.invoiceId)])

/** The office's changes to a draft, in order: who, when, why, the line before and after. */
export const invoiceAdjustments = pgTable('invoice_adjustments', {
  id: uuid('id').primaryKey().defaultRandom(),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id, { onDelete: 'cascade' }),
  action: text('action').notNull(),
  lineKey: text('line_key'),
  /** The change as the pricing replays it (a PriceAdjustment). */
  change: jsonb('change').$type<Record<string, unknown>>().notNull(),
  before: jsonb('before').$type<Record<string, unknown>>(),
  after: jsonb('after').$type<Record<string, unknown>>(),
  reason: text('reason').notNull(),
  byUserId: uuid('by_user_id').notNull().references(() => users.id),
  at: ts('at').notNull().defaultNow(),
}, t => [
  index('invoice_adjustments_invoice_idx').on(t.invoiceId, t.at),
  check('invoice_adjustments_action', sql`${t.action} IN ('add', 'change', 'remove', 'road')`),
])

export const payments = pgTable('payments', {
  id: uuid('id').primaryKey().defaultRandom(),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id),
  method: paymentMethodEnum('method').notNull(),
  amountCents: integer('amount_cents').notNull(),
  providerRef: text('provider_ref'),
  /** `succeeded` (card), `posted` (account), `recorded` (by hand); `held` does not count (wrong currency). */
  status: text('status').notNull(),
  currency: text('currency').notNull().default('usd'),
  /** Check number, transfer reference: what the office can find the money by. */
  reference: text('reference'),
  receivedOn: date('received_on', { mode: 'string' }),
  note: text('note'),
  /** The client's key for one intent to pay: a repeat of the same key answers with this payment. */
  idempotencyKey: text('idempotency_key'),
  byUserId: uuid('by_user_id').references(() => users.id),
  ...synced,
}, t => [
  uniqueIndex('payments_provider_ref_unique').on(t.providerRef),
  uniqueIndex('payments_idempotency_unique').on(t.idempotencyKey),
  uniqueIndex('payments_reference_unique').on(t.invoiceId, t.method, sql`lower(${t.reference})`).where(sql`${t.reference} IS NOT NULL`),
  index('payments_invoice_idx').on(t.invoiceId),
  check('payments_amount_pos', sql`${t.amountCents} > 0`),
])

/** Money given back on a payment: through the payment service for a card, by hand otherwise. */
export const refunds = pgTable('refunds', {
  id: uuid('id').primaryKey().defaultRandom(),
  paymentId: uuid('payment_id').notNull().references(() => payments.id),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id),
  amountCents: integer('amount_cents').notNull(),
  reason: text('reason').notNull(),
  providerRef: text('provider_ref'),
  idempotencyKey: text('idempotency_key'),
  byUserId: uuid('by_user_id').references(() => users.id),
  createdAt: ts('created_at').notNull().defaultNow(),
}, t => [
  uniqueIndex('refunds_provider_ref_unique').on(t.providerRef),
  uniqueIndex('refunds_idempotency_unique').on(t.idempotencyKey),
  index('refunds_invoice_idx').on(t.invoiceId),
  check('refunds_amount_pos', sql`${t.amountCents} > 0`),
])

/** Corrects an invoice already sent: its own number, negative lines, linked to the invoice. */
export const creditNotes = pgTable('credit_notes', {
  id: uuid('id').primaryKey().defaultRandom(),
  number: serial('number').notNull(),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id),
  reason: text('reason').notNull(),
  subtotalCents: integer('subtotal_cents').notNull(),
  taxCents: integer('tax_cents').notNull(),
  totalCents: integer('total_cents').notNull(),
  idempotencyKey: text('idempotency_key'),
  byUserId: uuid('by_user_id').references(() => users.id),
  createdAt: ts('created_at').notNull().defaultNow(),
}, t => [
  uniqueIndex('credit_notes_number_unique').on(t.number),
  uniqueIndex('credit_notes_idempotency_unique').on(t.idempotencyKey),
  index('credit_notes_invoice_idx').on(t.invoiceId),
  check('credit_notes_totals', sql`${t.totalCents} = ${t.subtotalCents} + ${t.taxCents} AND ${t.totalCents} < 0`),
])

export const creditNoteLines = pgTable('credit_note_lines', {
  id: uuid('id').primaryKey().defaultRandom(),
  creditNoteId: uuid('credit_note_id').notNull().references(() => creditNotes.id, { onDelete: 'cascade' }),
  sort: integer('sort').notNull().default(0),
  description: text('description').notNull(),
  amountCents: integer('amount_cents').notNull(),
  taxable: boolean('taxable').notNull(),
}, t => [
  index('credit_note_lines_note_idx').on(t.creditNoteId),
  check('credit_note_lines_negative', sql`${t.amountCents} < 0`),
])

/** Hosted payment pages opened for an invoice; at most one is open at a time. */
export const checkoutSessions = pgTable('checkout_sessions', {
  id: text('id').primaryKey(),
  invoiceId: uuid('invoice_id').notNull().references(() => invoices.id),
  amountCents: integer('amount_cents').notNull(),
  currency: text('currency').notNull(),
  url: text('url').notNull(),
  status: text('status').notNull().default('open'),
  expiresAt: ts('expires_at').notNull(),
  createdAt: ts('created_at').notNull().defaultNow(),
}, t => [
  index('checkout_sessions_invoice_idx').on(t.invoiceId, t.status),
  check('checkout_sessions_status', sql`${t.status} IN ('open', 'complete', 'expired')`),
])

/** Payment-service events already handled: a repeat delivery finds its id here and changes nothing. */
export const paymentEvents = pgTable('payment_events', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  invoiceId: uuid('invoice_id'),
  outcome: text('outcome').notNull(),
  receivedAt: ts('received_at').notNull().defaultNow(),
})

/** A fleet's running account: invoices charged to it and payments received on it. */
export const accountEntries = pgTable('account_entries', {
  id: uuid('id').primaryKey().defaultRandom(),
  customerId: uuid('customer_id').notNull().references(() => customers.id),
  invoiceId: uuid('invoice_id').references(() => invoices.id),
  amountCents: integer('amount_cents').notNull(),
  memo: text('memo').notNull(),
  ...synced,
}, t => [index('account_entries_customer_idx').on(t.customerId)])

/**
 * Links opened without an account (server/utils/links.ts): the fleet's status link and others by
 * `purpose`. Only the SHA-256 of the token is kept, so the table cannot hand out a working link.
 */
export const links = pgTable('links', {
  id: uuid('id').primaryKey().defaultRandom(),
  purpose: text('purpose').notNull(),
  /** The record the link opens (a call for `call_status`). */
  subjectId: uuid('subject_id').notNull(),
  tokenHash: text('token_hash').notNull(),
  expiresAt: ts('expires_at').notNull(),
  revokedAt: ts('revoked_at'),
  createdBy: uuid('created_by').references(() => users.id),
  createdAt: ts('created_at').notNull().defaultNow(),
  lastOpenedAt: ts('last_opened_at'),
}, t => [
  uniqueIndex('links_token_hash_unique').on(t.tokenHash),
  index('links_subject_idx').on(t.purpose, t.subjectId),
  check('links_token_hash_form', sql`${t.tokenHash} ~ '^[0-9a-f]{64}$'`),
])

// ── Sync ──────────────────────────────────────────────────────────────────────────────────
export const syncClients = pgTable('sync_clients', {
  id: uuid('id').primaryKey(),
  userId: uuid('user_id').notNull().references(() => users.id),
  lastSeq: bigint('last_seq', { mode: 'number' }).notNull().default(0),
  userAgent: text('user_agent'),
  createdAt: ts('created_at').notNull().defaultNow(),
  lastSeenAt: ts('last_seen_at').notNull().defaultNow(),
})

export const syncOps = pgTable('sync_ops', {
  opId: uuid('op_id').primaryKey(),
  clientId: uuid('client_id').notNull().references(() => syncClients.id),
  seq: bigint('seq', { mode: 'number' }).notNull(),
  entity: text('entity').notNull(),
  entityId: text('entity_id'),
  action: text('action').notNull(),
  status: syncOpStatusEnum('status').notNull(),
  version: integer('version'),
  reason: text('reason'),
  receivedAt: ts('received_at').notNull().defaultNow(),
}, t => [uniqueIndex('sync_ops_client_seq_unique').on(t.clientId, t.seq)])

export const conflicts = pgTable('conflicts', {
  id: uuid('id').primaryKey().defaultRandom(),
  callId: uuid('call_id').notNull().references(() => calls.id),
  entity: text('entity').notNull(),
  entityId: uuid('entity_id').notNull(),
  field: text('field').notNull(),
  baseValue: jsonb('base_value'),
  deviceValue: jsonb('device_value'),
  serverValue: jsonb('server_value'),
  reason: text('reason').notNull(),
  opId: uuid('op_id'),
  raisedBy: uuid('raised_by').references(() => users.id),
  status: conflictStatusEnum('status').notNull().default('open'),
  choice: text('choice'),
  resolvedValue: jsonb('resolved_value'),
  resolvedBy: uuid('resolved_by').references(() => users.id),
  resolvedAt: ts('resolved_at'),
  ...synced,
}, t => [
  index('conflicts_call_idx').on(t.callId, t.status),
  index('conflicts_change_idx').on(t.changeXid),
  check('conflicts_choice', sql`${t.choice} IS NULL OR ${t.choice} IN ('device', 'server', 'value')`),
])

/**
 * Every e-mail Wayside sends, one row per message: queued with its content, worked by a job
 * (server/utils/mail.ts), and marked sent or failed with the reason. `messageId` is fixed when
 * queued, so a retry resends the same message, never a new one.
 */
export const mailLog = pgTable('mail_log', {
  id: uuid('id').primaryKey().defaultRandom(),
  kind: text('kind').notNull(),
  toAddress: text('to_address').notNull(),
  subject: text('subject').notNull(),
  relatedId: uuid('related_id'),
  relatedType: text('related_type'),
  messageId: text('message_id'),
  /** `queued`, `sending`, `retrying`, `sent` or `failed`. */
  status: text('status').notNull(),
  error: text('error'),
  /** The text, HTML and attachment recipes the job sends (attachments are made at sending). */
  body: jsonb('body'),
  attempts: integer('attempts').notNull().default(0),
  queuedAt: ts('queued_at').notNull().defaultNow(),
  lastAttemptAt: ts('last_attempt_at'),
  sentAt: ts('sent_at'),
  queuedBy: uuid('queued_by').references(() => users.id),
}, t => [
  index('mail_log_related_idx').on(t.relatedId),
  uniqueIndex('mail_log_message_id_unique').on(t.messageId),
  check('mail_log_status', sql`${t.status} IN ('queued', 'sending', 'retrying', 'sent', 'failed')`),
])

// ── Relations ─────────────────────────────────────────────────────────────────────────────
export const callsRelations = relations(calls, ({ one, many }) => ({
  customer: one(customers, { fields: [calls.customerId], references: [customers.id] }),
  unit: one(units, { fields: [calls.unitId], references: [units.id] }),
  mechanic: one(users, { fields: [calls.mechanicId], references: [users.id] }),
  serviceTruck: one(serviceTrucks, { fields: [calls.serviceTruckId], references: [serviceTrucks.id] }),
  faultCodes: many(faultCodes),
  readings: many(readings),
  testRuns: many(testRuns),
  notes: many(notes),
  photos: many(photos),
  clockEvents: many(clockEvents),
  partLines: many(partLines),
  signOffs: many(signOffs),
  approvalRequests: many(approvalRequests),
  estimateSignatures: many(estimateSignatures),
  approvals: many(approvals),
  events: many(callEvents),
  conflicts: many(conflicts),
}))
export const customersRelations = relations(customers, ({ many }) => ({
  units: many(units),
  sites: many(customerSites),
  calls: many(calls),
}))
export const customerSitesRelations = relations(customerSites, ({ one }) => ({
  customer: one(customers, { fields: [customerSites.customerId], references: [customers.id] }),
}))
export const unitsRelations = relations(units, ({ one, many }) => ({
  customer: one(customers, { fields: [units.customerId], references: [customers.id] }),
  calls: many(calls),
}))
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- every child table has a callId column
const childOfCall = (table: any) => relations(table, ({ one }) => ({
  call: one(calls, { fields: [table.callId], references: [calls.id] }),
}))
export const faultCodesRelations = childOfCall(faultCodes)
export const readingsRelations = childOfCall(readings)
export const testRunsRelations = childOfCall(testRuns)
export const notesRelations = childOfCall(notes)
export const photosRelations = childOfCall(photos)
export const clockEventsRelations = childOfCall(clockEvents)
export const partLinesRelations = childOfCall(partLines)
export const signOffsRelations = childOfCall(signOffs)
export const approvalRequestsRelations = childOfCall(approvalRequests)
export const estimateSignaturesRelations = childOfCall(estimateSignatures)
export const approvalsRelations = childOfCall(approvals)
export const callEventsRelations = childOfCall(callEvents)
export const conflictsRelations = childOfCall(conflicts)
export const testCardsRelations = relations(testCards, ({ many }) => ({ versions: many(testCardVersions) }))
export const testCardVersionsRelations = relations(testCardVersions, ({ one }) => ({
  card: one(testCards, { fields: [testCardVersions.cardId], references: [testCards.id] }),
}))
export const serviceTrucksRelations = relations(serviceTrucks, ({ many, one }) => ({
  stock: many(truckStock),
  yard: one(yards, { fields: [serviceTrucks.yardId], references: [yards.id] }),
}))
export const truckStockRelations = relations(truckStock, ({ one }) => ({
  truck: one(serviceTrucks, { fields: [truckStock.truckId], references: [serviceTrucks.id] }),
}))
export const invoicesRelations = relations(invoices, ({ one, many }) => ({
  call: one(calls, { fields: [invoices.callId], references: [calls.id] }),
  customer: one(customers, { fields: [invoices.customerId], references: [customers.id] }),
  lines: many(invoiceLines),
  payments: many(payments),
  creditNotes: many(creditNotes),
  adjustments: many(invoiceAdjustments),
}))
export const invoiceAdjustmentsRelations = relations(invoiceAdjustments, ({ one }) => ({
  invoice: one(invoices, { fields: [invoiceAdjustments.invoiceId], references: [invoices.id] }),
  by: one(users, { fields: [invoiceAdjustments.byUserId], references: [users.id] }),
}))
export const invoiceLinesRelations = relations(invoiceLines, ({ one }) => ({
  invoice: one(invoices, { fields: [invoiceLines.invoiceId], references: [invoices.id] }),
}))
export const paymentsRelations = relations(payments, ({ one, many }) => ({
  invoice: one(invoices, { fields: [payments.invoiceId], references: [invoices.id] }),
  refunds: many(refunds),
}))
export const refundsRelations = relations(refunds, ({ one }) => ({
  payment: one(payments, { fields: [refunds.paymentId], references: [payments.id] }),
}))
export const creditNotesRelations = relations(creditNotes, ({ one, many }) => ({
  invoice: one(invoices, { fields: [creditNotes.invoiceId], references: [invoices.id] }),
  lines: many(creditNoteLines),
}))
export const creditNoteLinesRelations = relations(creditNoteLines, ({ one }) => ({
  note: one(creditNotes, { fields: [creditNoteLines.creditNoteId], references: [creditNotes.id] }),
}))
export const stockMovesRelations = relations(stockMoves, ({ one }) => ({
  truck: one(serviceTrucks, { fields: [stockMoves.truckId], references: [serviceTrucks.id] }),
  stock: one(truckStock, { fields: [stockMoves.stockId], references: [truckStock.id] }),
  by: one(users, { fields: [stockMoves.byUserId], references: [users.id] }),
}))
