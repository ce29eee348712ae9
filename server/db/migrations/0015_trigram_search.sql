-- Text search on trigram indexes (pg_trgm ships with PostgreSQL's contrib, in Debian's postgresql
-- package, and is a trusted extension: a database owner may create it). The expressions must stay
-- exactly as server/utils/callSearch.ts writes them, or the planner cannot use the indexes. Fields
-- are joined with a unit separator (0x1F), a character no search may hold, so no match spans two.
CREATE EXTENSION IF NOT EXISTS pg_trgm;
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS calls_search_trgm ON calls
  USING gin ((location_text || E'\x1f' || complaint || E'\x1f' || coalesce(po_number, '')) gin_trgm_ops);
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS customers_name_trgm ON customers USING gin (name gin_trgm_ops);
--> statement-breakpoint
CREATE INDEX IF NOT EXISTS units_search_trgm ON units USING gin ((unit_number || E'\x1f' || coalesce(vin, '')) gin_trgm_ops);
