CREATE TYPE "public"."billing_terms" AS ENUM('card', 'account');--> statement-breakpoint
CREATE TYPE "public"."call_outcome" AS ENUM('repaired', 'towed', 'parts_ordered', 'no_fault_found');--> statement-breakpoint
CREATE TYPE "public"."call_status" AS ENUM('received', 'assigned', 'en_route', 'on_site', 'completed', 'invoiced', 'paid', 'cancelled');--> statement-breakpoint
CREATE TYPE "public"."clock_kind" AS ENUM('travel_start', 'arrive', 'work_start', 'work_stop', 'depart');--> statement-breakpoint
CREATE TYPE "public"."conflict_status" AS ENUM('open', 'resolved');--> statement-breakpoint
CREATE TYPE "public"."derate_state" AS ENUM('none', 'derated', 'countdown', 'shutdown');--> statement-breakpoint
CREATE TYPE "public"."fault_state" AS ENUM('active', 'stored');--> statement-breakpoint
CREATE TYPE "public"."invoice_line_kind" AS ENUM('labor', 'travel', 'minimum', 'part', 'core', 'fee');--> statement-breakpoint
CREATE TYPE "public"."invoice_status" AS ENUM('draft', 'sent', 'paid', 'void');--> statement-breakpoint
CREATE TYPE "public"."payment_method" AS ENUM('card', 'account');--> statement-breakpoint
CREATE TYPE "public"."reading_quantity" AS ENUM('resistance', 'voltage', 'temperature', 'pressure', 'concentration', 'other');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('mechanic', 'dispatcher', 'office', 'admin');--> statement-breakpoint
CREATE TYPE "public"."sync_op_status" AS ENUM('applied', 'duplicate', 'conflict', 'rejected');--> statement-breakpoint
CREATE TYPE "public"."verdict" AS ENUM('pass', 'low', 'high');--> statement-breakpoint
CREATE TABLE "account_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"customer_id" uuid NOT NULL,
	"invoice_id" uuid,
	"amount_cents" integer NOT NULL,
	"memo" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "call_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"from_status" "call_status",
	"to_status" "call_status",
	"mechanic_id" uuid,
	"by_user_id" uuid,
	"note" text,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "calls" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" serial NOT NULL,
	"status" "call_status" DEFAULT 'received' NOT NULL,
	"outcome" "call_outcome",
	"customer_id" uuid NOT NULL,
	"unit_id" uuid,
	"location_text" text NOT NULL,
	"lat" double precision,
	"lon" double precision,
	"complaint" text NOT NULL,
	"lamps" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"derate" "derate_state" DEFAULT 'none' NOT NULL,
	"derate_note" text,
	"loaded" boolean DEFAULT false NOT NULL,
	"hazmat" boolean DEFAULT false NOT NULL,
	"safety_notes" text,
	"caller_name" text,
	"caller_phone" text,
	"po_number" text,
	"auth_limit_cents" integer,
	"mechanic_id" uuid,
	"service_truck_id" uuid,
	"story_complaint" text,
	"story_cause" text,
	"story_correction" text,
	"scene_checklist" jsonb,
	"verification" jsonb,
	"follow_up" text,
	"cancel_reason" text,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"assigned_at" timestamp with time zone,
	"en_route_at" timestamp with time zone,
	"on_site_at" timestamp with time zone,
	"completed_at" timestamp with time zone,
	"invoiced_at" timestamp with time zone,
	"paid_at" timestamp with time zone,
	"cancelled_at" timestamp with time zone,
	"status_changed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_by" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "calls_lat_range" CHECK ("calls"."lat" IS NULL OR "calls"."lat" BETWEEN -90 AND 90),
	CONSTRAINT "calls_lon_range" CHECK ("calls"."lon" IS NULL OR "calls"."lon" BETWEEN -180 AND 180),
	CONSTRAINT "calls_auth_limit_nonneg" CHECK ("calls"."auth_limit_cents" IS NULL OR "calls"."auth_limit_cents" >= 0),
	CONSTRAINT "calls_outcome_when_done" CHECK ("calls"."outcome" IS NULL OR "calls"."status" IN ('completed', 'invoiced', 'paid'))
);
--> statement-breakpoint
CREATE TABLE "clock_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"kind" "clock_kind" NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "conflicts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"entity" text NOT NULL,
	"entity_id" uuid NOT NULL,
	"field" text NOT NULL,
	"base_value" jsonb,
	"device_value" jsonb,
	"server_value" jsonb,
	"reason" text NOT NULL,
	"op_id" uuid,
	"raised_by" uuid,
	"status" "conflict_status" DEFAULT 'open' NOT NULL,
	"choice" text,
	"resolved_value" jsonb,
	"resolved_by" uuid,
	"resolved_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "conflicts_choice" CHECK ("conflicts"."choice" IS NULL OR "conflicts"."choice" IN ('device', 'server', 'value'))
);
--> statement-breakpoint
CREATE TABLE "customer_sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"customer_id" uuid NOT NULL,
	"name" text NOT NULL,
	"address" text,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "customers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"kind" text DEFAULT 'fleet' NOT NULL,
	"billing_terms" "billing_terms" DEFAULT 'card' NOT NULL,
	"net_days" integer,
	"billing_email" text,
	"phone" text,
	"tax_exempt" boolean DEFAULT false NOT NULL,
	"notes" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "customers_kind" CHECK ("customers"."kind" IN ('fleet', 'owner_operator')),
	CONSTRAINT "customers_net_days" CHECK ("customers"."net_days" IS NULL OR "customers"."net_days" BETWEEN 0 AND 180)
);
--> statement-breakpoint
CREATE TABLE "fault_codes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"code" text,
	"spn" integer,
	"fmi" integer,
	"state" "fault_state" DEFAULT 'active' NOT NULL,
	"count" integer DEFAULT 1 NOT NULL,
	"source" text,
	"cleared_at" timestamp with time zone,
	"note" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "fault_codes_form" CHECK ("fault_codes"."code" IS NOT NULL OR ("fault_codes"."spn" IS NOT NULL AND "fault_codes"."fmi" IS NOT NULL)),
	CONSTRAINT "fault_codes_spn_range" CHECK ("fault_codes"."spn" IS NULL OR "fault_codes"."spn" BETWEEN 0 AND 524287),
	CONSTRAINT "fault_codes_fmi_range" CHECK ("fault_codes"."fmi" IS NULL OR "fault_codes"."fmi" BETWEEN 0 AND 31),
	CONSTRAINT "fault_codes_count" CHECK ("fault_codes"."count" >= 0 AND "fault_codes"."count" <= 127)
);
--> statement-breakpoint
CREATE TABLE "invoice_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"invoice_id" uuid NOT NULL,
	"sort" integer DEFAULT 0 NOT NULL,
	"kind" "invoice_line_kind" NOT NULL,
	"description" text NOT NULL,
	"quantity" double precision NOT NULL,
	"unit_cents" integer NOT NULL,
	"amount_cents" integer NOT NULL,
	"taxable" boolean NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invoices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" serial NOT NULL,
	"call_id" uuid NOT NULL,
	"customer_id" uuid NOT NULL,
	"status" "invoice_status" DEFAULT 'draft' NOT NULL,
	"subtotal_cents" integer DEFAULT 0 NOT NULL,
	"tax_cents" integer DEFAULT 0 NOT NULL,
	"total_cents" integer DEFAULT 0 NOT NULL,
	"rates_id" uuid,
	"due_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"paid_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "invoices_totals" CHECK ("invoices"."total_cents" = "invoices"."subtotal_cents" + "invoices"."tax_cents")
);
--> statement-breakpoint
CREATE TABLE "login_attempts" (
	"key" text PRIMARY KEY NOT NULL,
	"failures" integer DEFAULT 0 NOT NULL,
	"last_failure_at" timestamp with time zone DEFAULT now() NOT NULL,
	"locked_until" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "mail_log" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" text NOT NULL,
	"to_address" text NOT NULL,
	"subject" text NOT NULL,
	"related_id" uuid,
	"message_id" text,
	"status" text NOT NULL,
	"error" text,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"text" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "part_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"part_number" text NOT NULL,
	"description" text NOT NULL,
	"quantity" double precision NOT NULL,
	"unit_price_cents" integer DEFAULT 0 NOT NULL,
	"core_charge_cents" integer DEFAULT 0 NOT NULL,
	"service_truck_id" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "part_lines_quantity" CHECK ("part_lines"."quantity" > 0),
	CONSTRAINT "part_lines_prices" CHECK ("part_lines"."unit_price_cents" >= 0 AND "part_lines"."core_charge_cents" >= 0)
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"invoice_id" uuid NOT NULL,
	"method" "payment_method" NOT NULL,
	"amount_cents" integer NOT NULL,
	"provider_ref" text,
	"status" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "payments_amount_pos" CHECK ("payments"."amount_cents" > 0)
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"caption" text,
	"content_type" text,
	"size_bytes" integer,
	"sha256" text,
	"storage_key" text,
	"uploaded_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"labor_cents_per_hour" integer NOT NULL,
	"after_hours_multiplier_pct" integer DEFAULT 150 NOT NULL,
	"minimum_labor_tenths" integer DEFAULT 10 NOT NULL,
	"road_call_minimum_cents" integer DEFAULT 0 NOT NULL,
	"travel_cents_per_unit" integer NOT NULL,
	"travel_unit" text DEFAULT 'km' NOT NULL,
	"parts_markup_pct" integer DEFAULT 0 NOT NULL,
	"tax_rate_basis_points" integer DEFAULT 0 NOT NULL,
	"labor_taxable" boolean DEFAULT false NOT NULL,
	"average_road_kph" integer DEFAULT 70 NOT NULL,
	"effective_from" timestamp with time zone DEFAULT now() NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "rates_travel_unit" CHECK ("rates"."travel_unit" IN ('km', 'mi')),
	CONSTRAINT "rates_nonneg" CHECK ("rates"."labor_cents_per_hour" >= 0 AND "rates"."travel_cents_per_unit" >= 0 AND "rates"."parts_markup_pct" >= 0 AND "rates"."tax_rate_basis_points" >= 0 AND "rates"."average_road_kph" > 0)
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"test_run_id" uuid,
	"step_id" text,
	"label" text NOT NULL,
	"quantity" "reading_quantity" NOT NULL,
	"value" double precision NOT NULL,
	"unit" text NOT NULL,
	"component" text,
	"pins" text,
	"conditions" text,
	"part_role" text,
	"spec" jsonb,
	"verdict" "verdict",
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "readings_part_role" CHECK ("readings"."part_role" IS NULL OR "readings"."part_role" IN ('installed', 'new'))
);
--> statement-breakpoint
CREATE TABLE "service_trucks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"plate" text,
	"yard_id" uuid,
	"active" boolean DEFAULT true NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_offs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"driver_name" text NOT NULL,
	"signature" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_clients" (
	"id" uuid PRIMARY KEY NOT NULL,
	"user_id" uuid NOT NULL,
	"last_seq" bigint DEFAULT 0 NOT NULL,
	"user_agent" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_seen_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sync_ops" (
	"op_id" uuid PRIMARY KEY NOT NULL,
	"client_id" uuid NOT NULL,
	"seq" bigint NOT NULL,
	"entity" text NOT NULL,
	"entity_id" text,
	"action" text NOT NULL,
	"status" "sync_op_status" NOT NULL,
	"version" integer,
	"reason" text,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_card_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"card_id" uuid NOT NULL,
	"card_version" integer NOT NULL,
	"definition" jsonb NOT NULL,
	"author_id" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_cards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"slug" text NOT NULL,
	"title" text NOT NULL,
	"component_type" text NOT NULL,
	"current_version" integer DEFAULT 1 NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"card_id" uuid NOT NULL,
	"card_version" integer NOT NULL,
	"ambient_c" double precision,
	"steps" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"conclusion" text,
	"finished_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "truck_stock" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"truck_id" uuid NOT NULL,
	"part_number" text NOT NULL,
	"description" text NOT NULL,
	"quantity" double precision DEFAULT 0 NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"core_charge_cents" integer DEFAULT 0 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "truck_stock_price_nonneg" CHECK ("truck_stock"."unit_price_cents" >= 0 AND "truck_stock"."core_charge_cents" >= 0)
);
--> statement-breakpoint
CREATE TABLE "units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"customer_id" uuid NOT NULL,
	"unit_number" text NOT NULL,
	"vin" text,
	"vin_override_reason" text,
	"year_make_model" text,
	"engine" text,
	"odometer" integer,
	"odometer_unit" text DEFAULT 'km' NOT NULL,
	"engine_hours" double precision,
	"notes" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "units_odometer_unit" CHECK ("units"."odometer_unit" IN ('km', 'mi')),
	CONSTRAINT "units_nonneg" CHECK (("units"."odometer" IS NULL OR "units"."odometer" >= 0) AND ("units"."engine_hours" IS NULL OR "units"."engine_hours" >= 0))
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"role" "role" NOT NULL,
	"password_hash" text NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"phone" text,
	"on_duty" boolean DEFAULT true NOT NULL,
	"last_lat" double precision,
	"last_lon" double precision,
	"last_position_at" timestamp with time zone,
	"home_truck_id" uuid,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "users_lat_range" CHECK ("users"."last_lat" IS NULL OR "users"."last_lat" BETWEEN -90 AND 90),
	CONSTRAINT "users_lon_range" CHECK ("users"."last_lon" IS NULL OR "users"."last_lon" BETWEEN -180 AND 180)
);
--> statement-breakpoint
CREATE TABLE "yards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"address" text NOT NULL,
	"lat" double precision NOT NULL,
	"lon" double precision NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "account_entries" ADD CONSTRAINT "account_entries_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "account_entries" ADD CONSTRAINT "account_entries_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "call_events" ADD CONSTRAINT "call_events_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "call_events" ADD CONSTRAINT "call_events_mechanic_id_users_id_fk" FOREIGN KEY ("mechanic_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "call_events" ADD CONSTRAINT "call_events_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_mechanic_id_users_id_fk" FOREIGN KEY ("mechanic_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_service_truck_id_service_trucks_id_fk" FOREIGN KEY ("service_truck_id") REFERENCES "public"."service_trucks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clock_events" ADD CONSTRAINT "clock_events_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clock_events" ADD CONSTRAINT "clock_events_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conflicts" ADD CONSTRAINT "conflicts_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conflicts" ADD CONSTRAINT "conflicts_raised_by_users_id_fk" FOREIGN KEY ("raised_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conflicts" ADD CONSTRAINT "conflicts_resolved_by_users_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "customer_sites" ADD CONSTRAINT "customer_sites_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_codes" ADD CONSTRAINT "fault_codes_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_codes" ADD CONSTRAINT "fault_codes_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD CONSTRAINT "invoice_lines_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_rates_id_rates_id_fk" FOREIGN KEY ("rates_id") REFERENCES "public"."rates"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notes" ADD CONSTRAINT "notes_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notes" ADD CONSTRAINT "notes_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_lines" ADD CONSTRAINT "part_lines_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_lines" ADD CONSTRAINT "part_lines_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "part_lines" ADD CONSTRAINT "part_lines_service_truck_id_service_trucks_id_fk" FOREIGN KEY ("service_truck_id") REFERENCES "public"."service_trucks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_test_run_id_test_runs_id_fk" FOREIGN KEY ("test_run_id") REFERENCES "public"."test_runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_trucks" ADD CONSTRAINT "service_trucks_yard_id_yards_id_fk" FOREIGN KEY ("yard_id") REFERENCES "public"."yards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sign_offs" ADD CONSTRAINT "sign_offs_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sign_offs" ADD CONSTRAINT "sign_offs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_clients" ADD CONSTRAINT "sync_clients_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sync_ops" ADD CONSTRAINT "sync_ops_client_id_sync_clients_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."sync_clients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_card_versions" ADD CONSTRAINT "test_card_versions_card_id_test_cards_id_fk" FOREIGN KEY ("card_id") REFERENCES "public"."test_cards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_card_versions" ADD CONSTRAINT "test_card_versions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_runs" ADD CONSTRAINT "test_runs_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_runs" ADD CONSTRAINT "test_runs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_runs" ADD CONSTRAINT "test_runs_card_id_test_cards_id_fk" FOREIGN KEY ("card_id") REFERENCES "public"."test_cards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "truck_stock" ADD CONSTRAINT "truck_stock_truck_id_service_trucks_id_fk" FOREIGN KEY ("truck_id") REFERENCES "public"."service_trucks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "account_entries_customer_idx" ON "account_entries" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "call_events_call_idx" ON "call_events" USING btree ("call_id","at");--> statement-breakpoint
CREATE UNIQUE INDEX "calls_number_unique" ON "calls" USING btree ("number");--> statement-breakpoint
CREATE INDEX "calls_status_idx" ON "calls" USING btree ("status");--> statement-breakpoint
CREATE INDEX "calls_mechanic_idx" ON "calls" USING btree ("mechanic_id","status");--> statement-breakpoint
CREATE INDEX "calls_customer_idx" ON "calls" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "calls_unit_idx" ON "calls" USING btree ("unit_id");--> statement-breakpoint
CREATE INDEX "calls_change_idx" ON "calls" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "clock_events_call_idx" ON "clock_events" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "clock_events_change_idx" ON "clock_events" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "conflicts_call_idx" ON "conflicts" USING btree ("call_id","status");--> statement-breakpoint
CREATE INDEX "conflicts_change_idx" ON "conflicts" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "customer_sites_customer_idx" ON "customer_sites" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "customers_name_idx" ON "customers" USING btree ("name");--> statement-breakpoint
CREATE INDEX "fault_codes_call_idx" ON "fault_codes" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "fault_codes_change_idx" ON "fault_codes" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "invoice_lines_invoice_idx" ON "invoice_lines" USING btree ("invoice_id");--> statement-breakpoint
CREATE UNIQUE INDEX "invoices_number_unique" ON "invoices" USING btree ("number");--> statement-breakpoint
CREATE INDEX "invoices_call_idx" ON "invoices" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "invoices_status_idx" ON "invoices" USING btree ("status");--> statement-breakpoint
CREATE INDEX "notes_call_idx" ON "notes" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "notes_change_idx" ON "notes" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "part_lines_call_idx" ON "part_lines" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "part_lines_change_idx" ON "part_lines" USING btree ("change_xid");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_provider_ref_unique" ON "payments" USING btree ("provider_ref");--> statement-breakpoint
CREATE INDEX "payments_invoice_idx" ON "payments" USING btree ("invoice_id");--> statement-breakpoint
CREATE INDEX "photos_call_idx" ON "photos" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "photos_change_idx" ON "photos" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "readings_call_idx" ON "readings" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "readings_change_idx" ON "readings" USING btree ("change_xid");--> statement-breakpoint
CREATE UNIQUE INDEX "service_trucks_name_unique" ON "service_trucks" USING btree ("name");--> statement-breakpoint
CREATE UNIQUE INDEX "sign_offs_call_unique" ON "sign_offs" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "sign_offs_change_idx" ON "sign_offs" USING btree ("change_xid");--> statement-breakpoint
CREATE UNIQUE INDEX "sync_ops_client_seq_unique" ON "sync_ops" USING btree ("client_id","seq");--> statement-breakpoint
CREATE UNIQUE INDEX "test_card_versions_unique" ON "test_card_versions" USING btree ("card_id","card_version");--> statement-breakpoint
CREATE UNIQUE INDEX "test_cards_slug_unique" ON "test_cards" USING btree ("slug");--> statement-breakpoint
CREATE INDEX "test_runs_call_idx" ON "test_runs" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "test_runs_change_idx" ON "test_runs" USING btree ("change_xid");--> statement-breakpoint
CREATE UNIQUE INDEX "truck_stock_part_unique" ON "truck_stock" USING btree ("truck_id","part_number");--> statement-breakpoint
CREATE INDEX "units_customer_idx" ON "units" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "units_vin_idx" ON "units" USING btree ("vin");--> statement-breakpoint
CREATE UNIQUE INDEX "units_customer_number_unique" ON "units" USING btree ("customer_id","unit_number");--> statement-breakpoint
CREATE UNIQUE INDEX "users_email_unique" ON "users" USING btree (lower("email"));