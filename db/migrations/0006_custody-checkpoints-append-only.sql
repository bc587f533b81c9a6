-- Custody checkpoints are append-only like the custody log: UPDATE, DELETE and TRUNCATE are refused.
-- The application's role does not own the table, so it cannot disable these triggers.
CREATE OR REPLACE FUNCTION custody_checkpoints_refuse_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'custody_checkpoints is append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER custody_checkpoints_no_update_delete BEFORE UPDATE OR DELETE ON custody_checkpoints
  FOR EACH ROW EXECUTE FUNCTION custody_checkpoints_refuse_change();
--> statement-breakpoint
CREATE TRIGGER custody_checkpoints_no_truncate BEFORE TRUNCATE ON custody_checkpoints
  FOR EACH STATEMENT EXECUTE FUNCTION custody_checkpoints_refuse_change();
