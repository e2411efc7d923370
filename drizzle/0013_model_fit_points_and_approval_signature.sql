ALTER TABLE "ocv_models" ADD COLUMN "reference_points" jsonb;--> statement-breakpoint
ALTER TABLE "ocv_models" ADD COLUMN "fit_sigma_v" double precision;--> statement-breakpoint
ALTER TABLE "ocv_models" ADD COLUMN "data_source" text;--> statement-breakpoint
ALTER TABLE "ocv_models" ADD COLUMN "approval_signature" jsonb;