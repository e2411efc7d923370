-- Stored documents are immutable: what was uploaded (lot, kind, name, type, size, hash, bytes,
-- uploader) can never be changed afterwards, by any write path. Only uploaded_at may move (the
-- demo seed dates its documents into the invented past). Deleting stays possible for the
-- ON DELETE CASCADE of a lot.
CREATE OR REPLACE FUNCTION documents_refuse_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	IF (NEW.id, NEW.lot_id, NEW.kind, NEW.file_name, NEW.mime, NEW.size_bytes, NEW.sha256, NEW.bytes, NEW.uploaded_by)
		IS DISTINCT FROM (OLD.id, OLD.lot_id, OLD.kind, OLD.file_name, OLD.mime, OLD.size_bytes, OLD.sha256, OLD.bytes, OLD.uploaded_by) THEN
		RAISE EXCEPTION 'documents are immutable: document % cannot be changed', OLD.id
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER documents_immutable BEFORE UPDATE ON documents FOR EACH ROW EXECUTE FUNCTION documents_refuse_change();
