CREATE TABLE "estimate_signatures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"driver_name" text NOT NULL,
	"signature" text NOT NULL,
	"work" text NOT NULL,
	"planned_labor_minutes" integer DEFAULT 0 NOT NULL,
	"planned_parts" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"lines" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"tax_cents" integer NOT NULL,
	"amount_cents" integer NOT NULL,
	"signed_at" timestamp with time zone NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "estimate_signatures_money" CHECK ("estimate_signatures"."amount_cents" >= 0 AND "estimate_signatures"."tax_cents" >= 0)
);
--> statement-breakpoint
ALTER TABLE "estimate_signatures" ADD CONSTRAINT "estimate_signatures_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "estimate_signatures" ADD CONSTRAINT "estimate_signatures_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "estimate_signatures_call_idx" ON "estimate_signatures" USING btree ("call_id","signed_at");--> statement-breakpoint
CREATE INDEX "estimate_signatures_change_idx" ON "estimate_signatures" USING btree ("change_xid");