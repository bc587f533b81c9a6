-- The custody log is append-only: UPDATE, DELETE and TRUNCATE are refused by triggers.
-- The application connects as a role that does not own this table, so it cannot disable them.
CREATE OR REPLACE FUNCTION custody_events_refuse_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'custody_events is append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER custody_events_no_update_delete BEFORE UPDATE OR DELETE ON custody_events
  FOR EACH ROW EXECUTE FUNCTION custody_events_refuse_change();
--> statement-breakpoint
CREATE TRIGGER custody_events_no_truncate BEFORE TRUNCATE ON custody_events
  FOR EACH STATEMENT EXECUTE FUNCTION custody_events_refuse_change();
