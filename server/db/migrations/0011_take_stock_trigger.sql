-- A part line taken from a service truck takes its parts off that truck's stock, once: the
-- trigger runs for a row actually inserted, and a resent op never inserts its part line twice
-- (same id), whatever path wrote it. A shortfall (more used than on hand, or a part the truck does
-- not stock) is recorded on the move, never refused: the mechanic already used the part.
CREATE OR REPLACE FUNCTION wayside_take_stock() RETURNS trigger AS $$
DECLARE
  sid uuid;
  had double precision;
  left_on double precision;
BEGIN
  SELECT id, quantity INTO sid, had FROM truck_stock
    WHERE truck_id = NEW.service_truck_id AND part_number = NEW.part_number FOR UPDATE;
  IF FOUND THEN
    -- Quantities carry at most two decimals; the rounding keeps float noise out of the count.
    left_on := round((had - NEW.quantity)::numeric, 2)::double precision;
    UPDATE truck_stock SET quantity = left_on WHERE id = sid;
    INSERT INTO stock_moves (truck_id, stock_id, part_number, kind, delta, before, after, shortfall, part_line_id, call_id, by_user_id)
    VALUES (NEW.service_truck_id, sid, NEW.part_number, 'used', -NEW.quantity, had, left_on,
      GREATEST(0, NEW.quantity - GREATEST(had, 0)), NEW.id, NEW.call_id, NEW.created_by);
  ELSE
    INSERT INTO stock_moves (truck_id, stock_id, part_number, kind, delta, shortfall, reason, part_line_id, call_id, by_user_id)
    VALUES (NEW.service_truck_id, NULL, NEW.part_number, 'used', -NEW.quantity, NEW.quantity,
      'not stocked on this truck', NEW.id, NEW.call_id, NEW.created_by);
  END IF;
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER part_lines_take_stock AFTER INSERT ON part_lines FOR EACH ROW
  WHEN (NEW.service_truck_id IS NOT NULL) EXECUTE FUNCTION wayside_take_stock();
