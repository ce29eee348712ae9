ALTER TABLE "mail_log" ALTER COLUMN "sent_at" DROP DEFAULT;--> statement-breakpoint
ALTER TABLE "mail_log" ALTER COLUMN "sent_at" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "related_type" text;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "body" jsonb;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "attempts" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "queued_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "last_attempt_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "mail_log" ADD COLUMN "queued_by" uuid;--> statement-breakpoint
ALTER TABLE "mail_log" ADD CONSTRAINT "mail_log_queued_by_users_id_fk" FOREIGN KEY ("queued_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "mail_log_related_idx" ON "mail_log" USING btree ("related_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mail_log_message_id_unique" ON "mail_log" USING btree ("message_id");--> statement-breakpoint
ALTER TABLE "mail_log" ADD CONSTRAINT "mail_log_status" CHECK ("mail_log"."status" IN ('queued', 'sending', 'retrying', 'sent', 'failed'));