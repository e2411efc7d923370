-- The served evaluation body is read whole on every GET of a lot's evaluation: keep it out of line
-- but uncompressed, so PostgreSQL does not inflate it on each read.
ALTER TABLE lot_evaluations_cache ALTER COLUMN body SET STORAGE EXTERNAL;
--> statement-breakpoint
-- Cached bodies are now ASCII-only JSON (services/evaluation-body.ts, servedJson); bodies cached
-- before may hold other characters. A cache: emptying it only costs one recomputation per lot.
TRUNCATE lot_evaluations_cache;
