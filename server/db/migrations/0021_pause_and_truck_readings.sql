ALTER TYPE "public"."clock_kind" ADD VALUE 'pause';--> statement-breakpoint
ALTER TABLE "calls" ADD COLUMN "odometer_reading" integer;--> statement-breakpoint
ALTER TABLE "calls" ADD COLUMN "engine_hours_reading" double precision;--> statement-breakpoint
ALTER TABLE "calls" ADD CONSTRAINT "calls_truck_readings_nonneg" CHECK (("calls"."odometer_reading" IS NULL OR "calls"."odometer_reading" >= 0) AND ("calls"."engine_hours_reading" IS NULL OR "calls"."engine_hours_reading" >= 0));