-- Review locks: PostgreSQL itself keeps the audit trail append-only and a sealed revision, its
-- steps, its decisions and the measurements (and original files) it used immutable.
--
-- Error codes (SQLSTATE) raised here, so the app can tell a lock from other failures:
--   HBA01  the audit trail is append-only
--   HBL01  a sealed (or replaced) revision or something it depends on is locked
--
-- "Used by a revision" is recorded in RevisionMeasurement(revisionId, measurementId). The table is
-- filled by the trigger below at the moment a revision enters state `sealed`, from the ids in
-- its snapshot: snapshot -> 'inputs' -> 'measurements' -> [*] -> 'id'. The app never writes it.
-- A row for a revision that is not sealed locks nothing (every check joins on the state).

-- ---------------------------------------------------------------------------------------------
-- (a) AuditEvent is append-only
CREATE FUNCTION heatbook_audit_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION USING ERRCODE = 'HBA01',
    MESSAGE = format('%s on "AuditEvent" refused: the audit trail is append-only (rows are never changed or removed)', TG_OP);
END $$;

CREATE TRIGGER "AuditEvent_append_only"
  BEFORE UPDATE OR DELETE ON "AuditEvent"
  FOR EACH ROW EXECUTE FUNCTION heatbook_audit_append_only();
CREATE TRIGGER "AuditEvent_no_truncate"
  BEFORE TRUNCATE ON "AuditEvent"
  FOR EACH STATEMENT EXECUTE FUNCTION heatbook_audit_append_only();

-- ---------------------------------------------------------------------------------------------
-- Which measurements a sealed revision used.
CREATE TABLE "RevisionMeasurement" (
    "revisionId" UUID NOT NULL,
    "measurementId" UUID NOT NULL,
    CONSTRAINT "RevisionMeasurement_pkey" PRIMARY KEY ("revisionId", "measurementId")
);
CREATE INDEX "RevisionMeasurement_measurementId_idx" ON "RevisionMeasurement"("measurementId");
ALTER TABLE "RevisionMeasurement" ADD CONSTRAINT "RevisionMeasurement_revisionId_fkey"
  FOREIGN KEY ("revisionId") REFERENCES "AnalysisRevision"("id") ON DELETE CASCADE ON UPDATE CASCADE;
ALTER TABLE "RevisionMeasurement" ADD CONSTRAINT "RevisionMeasurement_measurementId_fkey"
  FOREIGN KEY ("measurementId") REFERENCES "Measurement"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- Is this revision locked (sealed or replaced)?
CREATE FUNCTION heatbook_revision_locked(rev UUID) RETURNS boolean LANGUAGE sql STABLE AS $$
  SELECT EXISTS (SELECT 1 FROM "AnalysisRevision" r WHERE r."id" = rev AND r."state" IN ('sealed', 'replaced'));
$$;

-- The locked revision (id, number) that used this measurement, if any.
CREATE FUNCTION heatbook_measurement_lock(mid UUID) RETURNS TEXT LANGUAGE sql STABLE AS $$
  SELECT r."id"::text || ' (revision ' || r."number" || ', ' || r."state" || ')'
  FROM "RevisionMeasurement" rm JOIN "AnalysisRevision" r ON r."id" = rm."revisionId"
  WHERE rm."measurementId" = mid AND r."state" IN ('sealed', 'replaced')
  ORDER BY r."sealedAt" LIMIT 1;
$$;

-- ---------------------------------------------------------------------------------------------
-- (b) AnalysisRevision: born open; sealed only from in_review with its seal; immutable once sealed
-- except the single transition sealed -> replaced (state and updatedAt only); never deleted.
CREATE FUNCTION heatbook_revision_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    IF NEW."state" IN ('sealed', 'replaced') THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('INSERT of analysis revision %s in state %s refused: a revision starts open and is sealed only by approval', NEW."id", NEW."state");
    END IF;
    RETURN NEW;
  END IF;

  IF TG_OP = 'DELETE' THEN
    IF OLD."state" IN ('sealed', 'replaced') THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('DELETE of analysis revision %s refused: it is %s, and sealed revisions are kept for ever', OLD."id", OLD."state");
    END IF;
    RETURN OLD;
  END IF;

  -- UPDATE
  IF OLD."state" = 'sealed' AND NEW."state" = 'replaced' THEN
    IF (to_jsonb(NEW) - 'state' - 'updatedAt') IS DISTINCT FROM (to_jsonb(OLD) - 'state' - 'updatedAt') THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('UPDATE of sealed analysis revision %s refused: marking it replaced may change only its state and updatedAt', OLD."id");
    END IF;
    RETURN NEW;
  END IF;
  IF OLD."state" IN ('sealed', 'replaced') THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('UPDATE of analysis revision %s refused: it is %s and therefore immutable (revise it to make a new revision)', OLD."id", OLD."state");
  END IF;
  IF NEW."state" = 'replaced' THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('UPDATE of analysis revision %s refused: only a sealed revision can become replaced (it is %s)', OLD."id", OLD."state");
  END IF;
  IF NEW."state" = 'sealed' THEN
    IF OLD."state" <> 'in_review' THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('UPDATE of analysis revision %s refused: only a revision in review can be sealed (it is %s)', OLD."id", OLD."state");
    END IF;
    IF NEW."snapshot" IS NULL OR NEW."contentHash" IS NULL OR NEW."sealedById" IS NULL OR NEW."sealedAt" IS NULL THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('UPDATE of analysis revision %s refused: sealing needs the snapshot, its content hash, who sealed it and when', OLD."id");
    END IF;
  END IF;
  RETURN NEW;
END $$;

CREATE TRIGGER "AnalysisRevision_lock"
  BEFORE INSERT OR UPDATE OR DELETE ON "AnalysisRevision"
  FOR EACH ROW EXECUTE FUNCTION heatbook_revision_guard();

-- On sealing, record the measurements the snapshot names (this is what locks them).
CREATE FUNCTION heatbook_revision_record_measurements() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO "RevisionMeasurement" ("revisionId", "measurementId")
  SELECT DISTINCT NEW."id", (m ->> 'id')::uuid
  FROM jsonb_array_elements(COALESCE(NEW."snapshot" -> 'inputs' -> 'measurements', '[]'::jsonb)) AS m
  ON CONFLICT DO NOTHING;
  RETURN NULL;
END $$;

CREATE TRIGGER "AnalysisRevision_record_measurements"
  AFTER UPDATE OF "state" ON "AnalysisRevision"
  FOR EACH ROW WHEN (NEW."state" = 'sealed' AND OLD."state" IS DISTINCT FROM 'sealed')
  EXECUTE FUNCTION heatbook_revision_record_measurements();

-- RevisionMeasurement rows of a locked revision cannot be changed or removed.
CREATE FUNCTION heatbook_revision_measurement_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF heatbook_revision_locked(OLD."revisionId") THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('%s of "RevisionMeasurement" (%s, %s) refused: it records what sealed revision %s used', TG_OP, OLD."revisionId", OLD."measurementId", OLD."revisionId");
  END IF;
  RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
END $$;

CREATE TRIGGER "RevisionMeasurement_lock"
  BEFORE UPDATE OR DELETE ON "RevisionMeasurement"
  FOR EACH ROW EXECUTE FUNCTION heatbook_revision_measurement_guard();

-- ---------------------------------------------------------------------------------------------
-- (c) Steps of a sealed or replaced revision cannot be inserted, updated or deleted. While a
-- revision is in review its steps are frozen too, except that their computed outputs may be
-- refreshed (output, inputHash, engineVersion, computedAt, updatedAt): what the reviewer saw is
-- what gets sealed. The revision row is read FOR KEY SHARE, so a step write waits for an
-- approval that holds the row FOR UPDATE and then sees the sealed state (no race).
CREATE FUNCTION heatbook_step_revision_state(rev UUID) RETURNS "RevisionState" LANGUAGE plpgsql AS $$
DECLARE
  st "RevisionState";
BEGIN
  SELECT r."state" INTO st FROM "AnalysisRevision" r WHERE r."id" = rev FOR KEY SHARE;
  RETURN st;
END $$;

CREATE FUNCTION heatbook_step_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  rev UUID;
  st "RevisionState";
BEGIN
  FOREACH rev IN ARRAY (CASE TG_OP WHEN 'INSERT' THEN ARRAY[NEW."revisionId"] WHEN 'DELETE' THEN ARRAY[OLD."revisionId"]
                                   ELSE ARRAY[OLD."revisionId", NEW."revisionId"] END) LOOP
    st := heatbook_step_revision_state(rev);
    IF st IN ('sealed', 'replaced') THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('%s of a step of analysis revision %s refused: the revision is %s, so its steps are immutable', TG_OP, rev, st);
    END IF;
    IF st = 'in_review' AND (TG_OP <> 'UPDATE' OR
        (to_jsonb(NEW) - 'output' - 'inputHash' - 'engineVersion' - 'computedAt' - 'updatedAt')
          IS DISTINCT FROM (to_jsonb(OLD) - 'output' - 'inputHash' - 'engineVersion' - 'computedAt' - 'updatedAt')) THEN
      RAISE EXCEPTION USING ERRCODE = 'HBL01',
        MESSAGE = format('%s of a step of analysis revision %s refused: the revision is in review, so its steps are frozen (withdraw it, or let the reviewer return it, to edit)', TG_OP, rev);
    END IF;
  END LOOP;
  RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
END $$;

CREATE TRIGGER "Step_lock"
  BEFORE INSERT OR UPDATE OR DELETE ON "Step"
  FOR EACH ROW EXECUTE FUNCTION heatbook_step_guard();

-- Review decisions are never edited; those of a sealed revision are never removed.
CREATE FUNCTION heatbook_decision_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('UPDATE of review decision %s refused: decisions are recorded once and never edited', OLD."id");
  END IF;
  IF heatbook_revision_locked(OLD."revisionId") THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('DELETE of review decision %s refused: analysis revision %s is sealed', OLD."id", OLD."revisionId");
  END IF;
  RETURN OLD;
END $$;

CREATE TRIGGER "ReviewDecision_lock"
  BEFORE UPDATE OR DELETE ON "ReviewDecision"
  FOR EACH ROW EXECUTE FUNCTION heatbook_decision_guard();

-- ---------------------------------------------------------------------------------------------
-- (d) A measurement used by a locked revision, and its original file, cannot be updated or deleted.
CREATE FUNCTION heatbook_measurement_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  lock TEXT := heatbook_measurement_lock(OLD."id");
BEGIN
  IF lock IS NOT NULL THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('%s of measurement %s refused: sealed analysis revision %s used it', TG_OP, OLD."id", lock);
  END IF;
  RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
END $$;

CREATE TRIGGER "Measurement_lock"
  BEFORE UPDATE OR DELETE ON "Measurement"
  FOR EACH ROW EXECUTE FUNCTION heatbook_measurement_guard();

CREATE FUNCTION heatbook_file_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  lock TEXT;
  mid UUID;
BEGIN
  SELECT m."id", heatbook_measurement_lock(m."id") INTO mid, lock
  FROM "Measurement" m WHERE m."fileId" = OLD."id" AND heatbook_measurement_lock(m."id") IS NOT NULL LIMIT 1;
  IF lock IS NOT NULL THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('%s of stored file %s refused: it is the original of measurement %s, which sealed analysis revision %s used', TG_OP, OLD."id", mid, lock);
  END IF;
  RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
END $$;

CREATE TRIGGER "StoredFile_lock"
  BEFORE UPDATE OR DELETE ON "StoredFile"
  FOR EACH ROW EXECUTE FUNCTION heatbook_file_guard();

-- ---------------------------------------------------------------------------------------------
-- (e) Deleting an analysis, sample or group that owns a locked revision is refused (the cascade
-- would otherwise erase it). Checked before the cascade starts, with a message naming the owner.
CREATE FUNCTION heatbook_owner_guard() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  rev TEXT;
BEGIN
  SELECT r."id"::text || ' (revision ' || r."number" || ' of analysis ' || a."id" || ', ' || r."state" || ')' INTO rev
  FROM "AnalysisRevision" r JOIN "Analysis" a ON a."id" = r."analysisId"
  WHERE r."state" IN ('sealed', 'replaced')
    AND CASE TG_TABLE_NAME
          WHEN 'Analysis' THEN a."id" = OLD."id"
          WHEN 'Sample' THEN a."sampleId" = OLD."id"
          ELSE a."groupId" = OLD."id"
        END
  LIMIT 1;
  IF rev IS NOT NULL THEN
    RAISE EXCEPTION USING ERRCODE = 'HBL01',
      MESSAGE = format('DELETE of %s %s refused: it owns sealed analysis revision %s, which must be kept', lower(TG_TABLE_NAME), OLD."id", rev);
  END IF;
  RETURN OLD;
END $$;

CREATE TRIGGER "Analysis_keep_sealed" BEFORE DELETE ON "Analysis" FOR EACH ROW EXECUTE FUNCTION heatbook_owner_guard();
CREATE TRIGGER "Sample_keep_sealed" BEFORE DELETE ON "Sample" FOR EACH ROW EXECUTE FUNCTION heatbook_owner_guard();
CREATE TRIGGER "Group_keep_sealed" BEFORE DELETE ON "Group" FOR EACH ROW EXECUTE FUNCTION heatbook_owner_guard();
