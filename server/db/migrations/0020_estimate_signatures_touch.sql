CREATE TRIGGER estimate_signatures_touch BEFORE INSERT OR UPDATE ON estimate_signatures FOR EACH ROW EXECUTE FUNCTION wayside_touch();
