CREATE TABLE "signature_challenges" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"lot_revision" integer NOT NULL,
	"decision" text NOT NULL,
	"user_id" text NOT NULL,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	CONSTRAINT "signature_challenges_decision" CHECK ("signature_challenges"."decision" in ('accept', 'reject')),
	CONSTRAINT "signature_challenges_expiry_after_issue" CHECK ("signature_challenges"."expires_at" > "signature_challenges"."issued_at")
);
--> statement-breakpoint
ALTER TABLE "signature_challenges" ADD CONSTRAINT "signature_challenges_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signature_challenges" ADD CONSTRAINT "signature_challenges_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "signature_challenges_lot_idx" ON "signature_challenges" USING btree ("lot_id");