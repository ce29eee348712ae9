CREATE TABLE "invoice_adjustments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"invoice_id" uuid NOT NULL,
	"action" text NOT NULL,
	"line_key" text,
	"change" jsonb NOT NULL,
	"before" jsonb,
	"after" jsonb,
	"reason" text NOT NULL,
	"by_user_id" uuid NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoice_adjustments_action" CHECK ("invoice_adjustments"."action" IN ('add', 'change', 'remove', 'road'))
);
--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD COLUMN "key" text;--> statement-breakpoint
ALTER TABLE "invoice_lines" ADD COLUMN "source" jsonb;--> statement-breakpoint
ALTER TABLE "invoices" ADD COLUMN "pricing_input" jsonb;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "travel_basis" text DEFAULT 'distance' NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "travel_cents_per_hour" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "road_factor_pct" integer DEFAULT 100 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "travel_taxable" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "parts_taxable" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "cores_taxable" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "fees_taxable" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "shop_supplies_basis_points" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "shop_supplies_cap_cents" integer;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "environmental_fee_cents" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "time_zone" text DEFAULT 'UTC' NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "open_minute" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "close_minute" integer DEFAULT 1440 NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "open_days" jsonb DEFAULT '[1,2,3,4,5,6,7]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "holidays" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "business_name" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "business_phone" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "business_email" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "remit_address" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "invoice_adjustments" ADD CONSTRAINT "invoice_adjustments_invoice_id_invoices_id_fk" FOREIGN KEY ("invoice_id") REFERENCES "public"."invoices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoice_adjustments" ADD CONSTRAINT "invoice_adjustments_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "invoice_adjustments_invoice_idx" ON "invoice_adjustments" USING btree ("invoice_id","at");--> statement-breakpoint
ALTER TABLE "rates" ADD CONSTRAINT "rates_travel_basis" CHECK ("rates"."travel_basis" IN ('distance', 'time'));--> statement-breakpoint
ALTER TABLE "rates" ADD CONSTRAINT "rates_hours" CHECK ("rates"."open_minute" BETWEEN 0 AND 1440 AND "rates"."close_minute" BETWEEN 0 AND 1440);--> statement-breakpoint
ALTER TABLE "rates" ADD CONSTRAINT "rates_fees_nonneg" CHECK ("rates"."travel_cents_per_hour" >= 0 AND "rates"."shop_supplies_basis_points" >= 0 AND "rates"."environmental_fee_cents" >= 0 AND "rates"."road_factor_pct" >= 100);