CREATE TABLE "links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"purpose" text NOT NULL,
	"subject_id" uuid NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"revoked_at" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_opened_at" timestamp with time zone,
	CONSTRAINT "links_token_hash_form" CHECK ("links"."token_hash" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "rates" ADD COLUMN "status_link_days" integer DEFAULT 14 NOT NULL;--> statement-breakpoint
ALTER TABLE "links" ADD CONSTRAINT "links_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "links_token_hash_unique" ON "links" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "links_subject_idx" ON "links" USING btree ("purpose","subject_id");--> statement-breakpoint
ALTER TABLE "rates" ADD CONSTRAINT "rates_status_link_days" CHECK ("rates"."status_link_days" BETWEEN 1 AND 90);