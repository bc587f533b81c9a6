-- A job's closed_at is the moment its status became 'closed' (retention counts the disposal date from
-- it, lib/retention). Kept by the database, so every path that closes or reopens a job keeps it true:
-- set when the status turns 'closed', cleared when it leaves 'closed'. Jobs already closed get their
-- last update time, the best record there is of when they were closed.
CREATE OR REPLACE FUNCTION jobs_keep_closed_at() RETURNS trigger AS $$
BEGIN
  IF NEW.status = 'closed' AND (TG_OP = 'INSERT' OR OLD.status IS DISTINCT FROM 'closed') THEN
    NEW.closed_at := COALESCE(NEW.closed_at, now());
  ELSIF NEW.status <> 'closed' THEN
    NEW.closed_at := NULL;
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER jobs_closed_at BEFORE INSERT OR UPDATE OF status ON jobs
  FOR EACH ROW EXECUTE FUNCTION jobs_keep_closed_at();
--> statement-breakpoint
UPDATE jobs SET closed_at = updated_at WHERE status = 'closed' AND closed_at IS NULL;
