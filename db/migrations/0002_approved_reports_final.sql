-- An approved report version is final: its file, hash, size, version and approval can no longer
-- be changed or the row removed, by the application or anyone connecting as its role. A new
-- version is a new row. Enforced here as well as in lib/reports, so that a bug or a hand-written
-- UPDATE cannot quietly alter what a client was given.
CREATE OR REPLACE FUNCTION reports_refuse_change_after_approval() RETURNS trigger AS $$
BEGIN
  IF OLD.state = 'approved' THEN
    RAISE EXCEPTION 'report % version % is approved and final (% refused)', OLD.job_id, OLD.version, TG_OP
      USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF TG_OP = 'DELETE' THEN
    RETURN OLD;
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER reports_final_after_approval BEFORE UPDATE OR DELETE ON reports
  FOR EACH ROW EXECUTE FUNCTION reports_refuse_change_after_approval();
