ALTER TABLE "parts" ADD COLUMN "auto_release_accept" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "decisions" ADD COLUMN "disposition" text;--> statement-breakpoint
ALTER TABLE "decisions" ADD COLUMN "supplier_due_date" date;