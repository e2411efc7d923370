DROP INDEX "notices_outbox_idx";--> statement-breakpoint
CREATE INDEX "notices_status_idx" ON "notices" USING btree ("status","created_at");--> statement-breakpoint
ALTER TABLE "notices" DROP COLUMN "next_attempt_at";