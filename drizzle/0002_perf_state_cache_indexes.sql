CREATE TABLE "lot_evaluations_cache" (
	"lot_id" uuid PRIMARY KEY NOT NULL,
	"revision" integer NOT NULL,
	"body" text NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sampling_states" (
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"severity" "inspection_severity" NOT NULL,
	"switching_score" double precision NOT NULL,
	"history" jsonb NOT NULL,
	"last_lot_decided_at" timestamp with time zone,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sampling_states_supplier_id_part_id_pk" PRIMARY KEY("supplier_id","part_id")
);
--> statement-breakpoint
DROP INDEX "lots_created_idx";--> statement-breakpoint
DROP INDEX "lots_status_created_idx";--> statement-breakpoint
DROP INDEX "lots_supplier_created_idx";--> statement-breakpoint
ALTER TABLE "lots" ADD COLUMN "revision" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "lot_evaluations_cache" ADD CONSTRAINT "lot_evaluations_cache_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sampling_states" ADD CONSTRAINT "sampling_states_supplier_id_organisations_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sampling_states" ADD CONSTRAINT "sampling_states_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "lots_created_idx" ON "lots" USING btree ("created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "lots_status_created_idx" ON "lots" USING btree ("status","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);--> statement-breakpoint
CREATE INDEX "lots_supplier_created_idx" ON "lots" USING btree ("supplier_id","created_at" DESC NULLS FIRST,"id" DESC NULLS FIRST);