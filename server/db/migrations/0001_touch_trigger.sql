-- Versions, update times and the change transaction id are the server's: a trigger sets them on
-- every write, so no code path (sync, office edit, seed) can forget or forge them.
CREATE OR REPLACE FUNCTION wayside_touch() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'UPDATE' THEN
    NEW.version := OLD.version + 1;
    NEW.created_at := OLD.created_at;
  ELSE
    NEW.version := 1;
  END IF;
  NEW.updated_at := now();
  NEW.change_xid := pg_current_xact_id();
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
DO $$
DECLARE t text;
BEGIN
  FOREACH t IN ARRAY ARRAY['users','yards','service_trucks','truck_stock','rates','customers','customer_sites','units',
    'calls','call_events','fault_codes','test_cards','test_card_versions','test_runs','readings','notes','photos',
    'clock_events','part_lines','sign_offs','invoices','payments','account_entries','conflicts']
  LOOP
    EXECUTE format('CREATE TRIGGER %I BEFORE INSERT OR UPDATE ON %I FOR EACH ROW EXECUTE FUNCTION wayside_touch()', t || '_touch', t);
  END LOOP;
END $$;
