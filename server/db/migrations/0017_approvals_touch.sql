CREATE TRIGGER approval_requests_touch BEFORE INSERT OR UPDATE ON approval_requests FOR EACH ROW EXECUTE FUNCTION wayside_touch();
--> statement-breakpoint
CREATE TRIGGER approvals_touch BEFORE INSERT OR UPDATE ON approvals FOR EACH ROW EXECUTE FUNCTION wayside_touch();
