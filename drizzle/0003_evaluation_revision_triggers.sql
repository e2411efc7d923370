-- lots.revision is the key of lot_evaluations_cache: every write that can change a lot's evaluation
-- bumps it in the same transaction, here in the database so that no write path (service, seed,
-- script) can forget it. Inputs of an evaluation: the lot row, its readings and documents, its
-- part (limits, model, sampling settings), the part's OCV model and the supplier × part switching
-- state (sampling_states).

-- The lot row itself: any change (status, quantity, declared SOC, decided_at…) unless the
-- statement already set a new revision.
CREATE OR REPLACE FUNCTION lots_bump_revision() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	IF NEW.revision = OLD.revision AND NEW IS DISTINCT FROM OLD THEN
		NEW.revision := OLD.revision + 1;
	END IF;
	RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER lots_bump_revision BEFORE UPDATE ON lots FOR EACH ROW EXECUTE FUNCTION lots_bump_revision();
--> statement-breakpoint

-- Readings and documents: once per statement (a 10,000-row import bumps its lot once).
CREATE OR REPLACE FUNCTION lots_bump_revision_of_changed_rows() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	UPDATE lots SET revision = revision + 1 WHERE id IN (SELECT DISTINCT lot_id FROM changed_rows);
	RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER readings_bump_insert AFTER INSERT ON readings REFERENCING NEW TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint
CREATE TRIGGER readings_bump_update AFTER UPDATE ON readings REFERENCING NEW TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint
CREATE TRIGGER readings_bump_delete AFTER DELETE ON readings REFERENCING OLD TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint
CREATE TRIGGER documents_bump_insert AFTER INSERT ON documents REFERENCING NEW TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint
CREATE TRIGGER documents_bump_update AFTER UPDATE ON documents REFERENCING NEW TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint
CREATE TRIGGER documents_bump_delete AFTER DELETE ON documents REFERENCING OLD TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION lots_bump_revision_of_changed_rows();
--> statement-breakpoint

-- A part's limits, model or sampling settings: all its lots. A new AQL or inspection level also
-- changes the switching replay, so the stored states of the part are dropped (rebuilt on next
-- read) under the same advisory lock the state writers take (services/sampling-state.ts).
CREATE OR REPLACE FUNCTION parts_bump_lot_revisions() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	IF NEW IS DISTINCT FROM OLD THEN
		IF NEW.aql IS DISTINCT FROM OLD.aql OR NEW.inspection_level IS DISTINCT FROM OLD.inspection_level THEN
			PERFORM pg_advisory_xact_lock(hashtext('restvolt.sampling:' || NEW.id::text));
			DELETE FROM sampling_states WHERE part_id = NEW.id;
		END IF;
		UPDATE lots SET revision = revision + 1 WHERE part_id = NEW.id;
	END IF;
	RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER parts_bump_lot_revisions AFTER UPDATE ON parts FOR EACH ROW EXECUTE FUNCTION parts_bump_lot_revisions();
--> statement-breakpoint

-- An OCV model's parameters (stored versions are normally immutable; this keeps the cache honest).
CREATE OR REPLACE FUNCTION ocv_models_bump_lot_revisions() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	IF NEW.parameters IS DISTINCT FROM OLD.parameters THEN
		UPDATE lots SET revision = revision + 1 WHERE part_id IN (SELECT id FROM parts WHERE model_id = NEW.id);
	END IF;
	RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER ocv_models_bump_lot_revisions AFTER UPDATE ON ocv_models FOR EACH ROW EXECUTE FUNCTION ocv_models_bump_lot_revisions();
--> statement-breakpoint

-- The switching state of a supplier × part: its undecided lots (decided lots keep the severity
-- as of their own decision, replayed from the history).
CREATE OR REPLACE FUNCTION sampling_states_bump_open_lots() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
	s uuid := COALESCE(NEW.supplier_id, OLD.supplier_id);
	p uuid := COALESCE(NEW.part_id, OLD.part_id);
BEGIN
	IF TG_OP = 'UPDATE' AND NEW.severity = OLD.severity AND NEW.switching_score = OLD.switching_score AND NEW.history = OLD.history THEN
		RETURN NULL;
	END IF;
	UPDATE lots SET revision = revision + 1 WHERE supplier_id = s AND part_id = p AND decided_at IS NULL;
	RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER sampling_states_bump_open_lots AFTER INSERT OR UPDATE OR DELETE ON sampling_states FOR EACH ROW EXECUTE FUNCTION sampling_states_bump_open_lots();
--> statement-breakpoint

-- Cached bodies are read far more often than written: keep them uncompressed out of line (no
-- pglz decompression of ~90 KB on every read).
ALTER TABLE lot_evaluations_cache ALTER COLUMN body SET STORAGE EXTERNAL;
