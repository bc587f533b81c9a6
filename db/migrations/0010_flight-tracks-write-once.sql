-- A flight track is evidence like a recording's original: once imported, its file, hash, size and the
-- points read from it never change (a corrected track is a new import on a new flight record). The
-- alignments of a track are a history: a new alignment is a new row, an old one is never rewritten
-- (only its recording reference may be cleared when that recording row is removed). Enforced here as
-- well as in lib/tracks, so that a bug or a hand-written UPDATE cannot alter a figure behind a range check.
CREATE OR REPLACE FUNCTION flight_tracks_refuse_change() RETURNS trigger AS $$
BEGIN
  IF NEW.original_name IS DISTINCT FROM OLD.original_name OR NEW.format IS DISTINCT FROM OLD.format
     OR NEW.size_bytes IS DISTINCT FROM OLD.size_bytes OR NEW.sha256 IS DISTINCT FROM OLD.sha256
     OR NEW.storage_key IS DISTINCT FROM OLD.storage_key OR NEW.points IS DISTINCT FROM OLD.points
     OR NEW.starts_at IS DISTINCT FROM OLD.starts_at OR NEW.ends_at IS DISTINCT FROM OLD.ends_at
     OR NEW.flight_id IS DISTINCT FROM OLD.flight_id OR NEW.organisation_id IS DISTINCT FROM OLD.organisation_id THEN
    RAISE EXCEPTION 'flight track % is write-once (UPDATE refused)', OLD.id USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER flight_tracks_write_once BEFORE UPDATE ON flight_tracks
  FOR EACH ROW EXECUTE FUNCTION flight_tracks_refuse_change();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION track_alignments_refuse_change() RETURNS trigger AS $$
BEGIN
  IF NEW.recording_id IS NULL AND (to_jsonb(NEW) - 'recording_id') = (to_jsonb(OLD) - 'recording_id') THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION 'track alignment % is history (UPDATE refused): set a new alignment instead', OLD.id
    USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER track_alignments_history BEFORE UPDATE ON track_alignments
  FOR EACH ROW EXECUTE FUNCTION track_alignments_refuse_change();
