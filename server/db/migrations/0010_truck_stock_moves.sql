CREATE TABLE "stock_moves" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"truck_id" uuid NOT NULL,
	"stock_id" uuid,
	"part_number" text NOT NULL,
	"kind" text NOT NULL,
	"delta" double precision NOT NULL,
	"before" double precision,
	"after" double precision,
	"shortfall" double precision DEFAULT 0 NOT NULL,
	"reason" text,
	"part_line_id" uuid,
	"call_id" uuid,
	"transfer_id" uuid,
	"by_user_id" uuid,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stock_moves_kind" CHECK ("stock_moves"."kind" IN ('used', 'count', 'transfer_out', 'transfer_in', 'added')),
	CONSTRAINT "stock_moves_shortfall" CHECK ("stock_moves"."shortfall" >= 0)
);
--> statement-breakpoint
ALTER TABLE "truck_stock" ADD COLUMN "bin" text;--> statement-breakpoint
ALTER TABLE "truck_stock" ADD COLUMN "minimum" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "truck_stock" ADD COLUMN "cost_cents" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_truck_id_service_trucks_id_fk" FOREIGN KEY ("truck_id") REFERENCES "public"."service_trucks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_stock_id_truck_stock_id_fk" FOREIGN KEY ("stock_id") REFERENCES "public"."truck_stock"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_part_line_id_part_lines_id_fk" FOREIGN KEY ("part_line_id") REFERENCES "public"."part_lines"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_call_id_calls_id_fk" FOREIGN KEY ("call_id") REFERENCES "public"."calls"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stock_moves" ADD CONSTRAINT "stock_moves_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "stock_moves_part_line_unique" ON "stock_moves" USING btree ("part_line_id");--> statement-breakpoint
CREATE INDEX "stock_moves_truck_idx" ON "stock_moves" USING btree ("truck_id","at");--> statement-breakpoint
CREATE INDEX "stock_moves_stock_idx" ON "stock_moves" USING btree ("stock_id","at");--> statement-breakpoint
ALTER TABLE "truck_stock" ADD CONSTRAINT "truck_stock_minimum_cost" CHECK ("truck_stock"."minimum" >= 0 AND "truck_stock"."cost_cents" >= 0);