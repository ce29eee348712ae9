CREATE TABLE "approval_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"created_by" uuid,
	"device_at" timestamp with time zone,
	"diagnosis" text NOT NULL,
	"needed" text,
	"planned_labor_minutes" integer DEFAULT 0 NOT NULL,
	"planned_parts" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"estimate_cents" integer NOT NULL,
	"limit_cents" integer,
	"photo_ids" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "approval_requests_money" CHECK ("approval_requests"."estimate_cents" >= 0 AND ("approval_requests"."limit_cents" IS NULL OR "approval_requests"."limit_cents" >= 0))
);
--> statement-breakpoint
CREATE TABLE "approvals" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"call_id" uuid NOT NULL,
	"request_id" uuid,
	"decision" text NOT NULL,
	"approved_by" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"po_number" text,
	"channel" text NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL,
	"recorded_by" uuid,
	"link_id" uuid,
	"previous_limit_cents" integer,
	"previous_po_number" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"change_xid" "xid8" DEFAULT pg_current_xact_id() NOT NULL,
	CONSTRAINT "approvals_decision" CHECK ("approvals"."decision" IN ('approved', 'declined')),
	CONSTRAINT "approvals_channel" CHECK ("approvals"."channel" IN ('phone', 'email', 'link')),
	CONSTRAINT "approvals_amount" CHECK ("approvals"."amount_cents" >= 0)
);
--> statement-breakpoint
ALTER TABLE "calls" ADD COLUMN "after_decline" text;--> statement-breakpoint
ALTER TABLE "approval_requests" ADD CONSTRAINT "approval_requests_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approval_requests" ADD CONSTRAINT "approval_requests_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_request_id_approval_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."approval_requests"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "approvals" ADD CONSTRAINT "approvals_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "approval_requests_call_idx" ON "approval_requests" USING btree ("call_id");--> statement-breakpoint
CREATE INDEX "approval_requests_change_idx" ON "approval_requests" USING btree ("change_xid");--> statement-breakpoint
CREATE INDEX "approvals_call_idx" ON "approvals" USING btree ("call_id","decided_at");--> statement-breakpoint
CREATE INDEX "approvals_change_idx" ON "approvals" USING btree ("change_xid");--> statement-breakpoint
CREATE UNIQUE INDEX "approvals_request_unique" ON "approvals" USING btree ("request_id");--> statement-breakpoint
CREATE UNIQUE INDEX "approvals_link_unique" ON "approvals" USING btree ("link_id");--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_after_decline" CHECK ("calls"."after_decline" IS NULL OR "calls"."after_decline" IN ('make_safe_release', 'tow', 'stop'));