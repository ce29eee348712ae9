CREATE INDEX "call_events_reached_idx" ON "call_events" USING btree ("to_status","at");--> statement-breakpoint
CREATE INDEX "calls_received_idx" ON "calls" USING btree ("received_at","number","id");--> statement-breakpoint
CREATE INDEX "calls_status_received_idx" ON "calls" USING btree ("status","received_at","number");--> statement-breakpoint
CREATE INDEX "calls_status_changed_idx" ON "calls" USING btree ("status_changed_at","number");--> statement-breakpoint
CREATE INDEX "calls_unit_received_idx" ON "calls" USING btree ("unit_id","received_at","number");--> statement-breakpoint
CREATE INDEX "calls_completed_idx" ON "calls" USING btree ("completed_at");--> statement-breakpoint
CREATE INDEX "clock_events_at_idx" ON "clock_events" USING btree (coalesce("device_at", "created_at"));--> statement-breakpoint
CREATE INDEX "invoices_sent_idx" ON "invoices" USING btree ("sent_at");