CREATE TYPE "public"."disposition" AS ENUM('pending', 'accept', 'hold', 'reject');--> statement-breakpoint
CREATE TYPE "public"."document_kind" AS ENUM('coc', 'un38_3_summary', 'sds', 'other', 'corrective_action');--> statement-breakpoint
CREATE TYPE "public"."lot_status" AS ENUM('draft', 'awaiting_arrival', 'in_inspection', 'pending_decision', 'accepted', 'on_hold', 'rejected', 'cancelled');--> statement-breakpoint
CREATE TYPE "public"."notice_status" AS ENUM('pending', 'sent', 'failed');--> statement-breakpoint
CREATE TYPE "public"."organisation_kind" AS ENUM('own', 'supplier');--> statement-breakpoint
CREATE TYPE "public"."reading_source" AS ENUM('keyboard', 'import', 'api');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('buyer', 'inspector', 'quality', 'supplier', 'admin');--> statement-breakpoint
CREATE TYPE "public"."inspection_severity" AS ENUM('normal', 'tightened', 'reduced', 'discontinued');--> statement-breakpoint
CREATE TYPE "public"."transport_mode" AS ENUM('air', 'sea', 'road', 'rail');--> statement-breakpoint
CREATE TABLE "organisations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"kind" "organisation_kind" NOT NULL,
	"country" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisations_name_unique" UNIQUE("name")
);
--> statement-breakpoint
CREATE TABLE "supplier_contacts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"name" text NOT NULL,
	"email" text NOT NULL,
	"receives_notices" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "account" (
	"userId" text NOT NULL,
	"type" text NOT NULL,
	"provider" text NOT NULL,
	"providerAccountId" text NOT NULL,
	"refresh_token" text,
	"access_token" text,
	"expires_at" integer,
	"token_type" text,
	"scope" text,
	"id_token" text,
	"session_state" text,
	CONSTRAINT "account_provider_providerAccountId_pk" PRIMARY KEY("provider","providerAccountId")
);
--> statement-breakpoint
CREATE TABLE "password_resets" (
	"token_hash" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "session" (
	"sessionToken" text PRIMARY KEY NOT NULL,
	"userId" text NOT NULL,
	"expires" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_in_failures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"throttle_key" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "user" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text,
	"email" text NOT NULL,
	"emailVerified" timestamp with time zone,
	"image" text,
	"role" "role" DEFAULT 'supplier' NOT NULL,
	"organisation_id" uuid,
	"password_hash" text,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "user_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "verificationToken" (
	"identifier" text NOT NULL,
	"token" text NOT NULL,
	"expires" timestamp with time zone NOT NULL,
	CONSTRAINT "verificationToken_identifier_token_pk" PRIMARY KEY("identifier","token")
);
--> statement-breakpoint
CREATE TABLE "api_tokens" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"label" text NOT NULL,
	"token_hash" text NOT NULL,
	"prefix" text NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	CONSTRAINT "api_tokens_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "ocv_models" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"chemistry" text NOT NULL,
	"version" text NOT NULL,
	"name" text NOT NULL,
	"origin" text NOT NULL,
	"parameters" jsonb NOT NULL,
	"source" text NOT NULL,
	"fit_temperature_c" double precision,
	"fit_rmse_v" double precision,
	"fit_max_error_v" double precision,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"approved_by" text,
	"approved_at" timestamp with time zone,
	CONSTRAINT "ocv_models_chemistry_version_uq" UNIQUE("chemistry","version")
);
--> statement-breakpoint
CREATE TABLE "parts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_number" text NOT NULL,
	"description" text NOT NULL,
	"chemistry" text NOT NULL,
	"cells_in_series" integer DEFAULT 1 NOT NULL,
	"cells_in_parallel" integer DEFAULT 1 NOT NULL,
	"nominal_capacity_ah" double precision NOT NULL,
	"model_id" uuid,
	"ocv_min_cell_v" double precision NOT NULL,
	"ocv_max_cell_v" double precision NOT NULL,
	"residual_tolerance_mv" double precision DEFAULT 60 NOT NULL,
	"spread_limit_mv" double precision DEFAULT 50 NOT NULL,
	"outlier_k" double precision DEFAULT 4 NOT NULL,
	"self_discharge_limit_mv_per_day" double precision DEFAULT 2 NOT NULL,
	"declared_soc_tolerance" double precision DEFAULT 0.1 NOT NULL,
	"meter_accuracy_v" double precision DEFAULT 0.002 NOT NULL,
	"aql" double precision DEFAULT 1 NOT NULL,
	"inspection_level" text DEFAULT 'II' NOT NULL,
	"required_documents" text[] DEFAULT '{coc}'::text[] NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "parts_supplier_part_number_uq" UNIQUE("supplier_id","part_number"),
	CONSTRAINT "parts_series_positive" CHECK ("parts"."cells_in_series" >= 1),
	CONSTRAINT "parts_parallel_positive" CHECK ("parts"."cells_in_parallel" >= 1),
	CONSTRAINT "parts_capacity_positive" CHECK ("parts"."nominal_capacity_ah" > 0),
	CONSTRAINT "parts_window_order" CHECK ("parts"."ocv_min_cell_v" < "parts"."ocv_max_cell_v"),
	CONSTRAINT "parts_soc_tolerance_range" CHECK ("parts"."declared_soc_tolerance" > 0 and "parts"."declared_soc_tolerance" <= 1)
);
--> statement-breakpoint
CREATE TABLE "inspection_resumptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"reason" text NOT NULL,
	"resumed_by" text,
	"resumed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lots" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_code" text NOT NULL,
	"po_number" text NOT NULL,
	"supplier_id" uuid NOT NULL,
	"part_id" uuid NOT NULL,
	"quantity" integer NOT NULL,
	"declared_soc" double precision,
	"transport" "transport_mode" NOT NULL,
	"un_number" text,
	"expected_arrival" date,
	"received_at" timestamp with time zone,
	"status" "lot_status" DEFAULT 'draft' NOT NULL,
	"severity" "inspection_severity",
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decided_at" timestamp with time zone,
	CONSTRAINT "lots_lot_code_unique" UNIQUE("lot_code"),
	CONSTRAINT "lots_quantity_positive" CHECK ("lots"."quantity" > 0),
	CONSTRAINT "lots_declared_soc_range" CHECK ("lots"."declared_soc" is null or ("lots"."declared_soc" >= 0 and "lots"."declared_soc" <= 1)),
	CONSTRAINT "lots_un_number_format" CHECK ("lots"."un_number" is null or "lots"."un_number" ~ '^UN[0-9]{4}$')
);
--> statement-breakpoint
CREATE TABLE "documents" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"kind" "document_kind" NOT NULL,
	"file_name" text NOT NULL,
	"mime" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"bytes" "bytea" NOT NULL,
	"uploaded_by" text,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "documents_lot_sha_uq" UNIQUE("lot_id","sha256"),
	CONSTRAINT "documents_size_positive" CHECK ("documents"."size_bytes" > 0)
);
--> statement-breakpoint
CREATE TABLE "reading_imports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"file_sha256" text NOT NULL,
	"row_count" integer NOT NULL,
	"imported_by" text,
	"imported_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reading_imports_lot_sha_uq" UNIQUE("lot_id","file_sha256")
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"lot_id" uuid NOT NULL,
	"serial" text NOT NULL,
	"ocv_v" double precision NOT NULL,
	"temperature_c" double precision NOT NULL,
	"ac_resistance_mohm" double precision,
	"measured_at" timestamp with time zone DEFAULT now() NOT NULL,
	"source" "reading_source" NOT NULL,
	"import_id" uuid,
	"client_key" text,
	"entered_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "readings_lot_client_key_uq" UNIQUE("lot_id","client_key"),
	CONSTRAINT "readings_ocv_range" CHECK ("readings"."ocv_v" >= 0 and "readings"."ocv_v" < 1000),
	CONSTRAINT "readings_temperature_range" CHECK ("readings"."temperature_c" > -60 and "readings"."temperature_c" < 120),
	CONSTRAINT "readings_resistance_positive" CHECK ("readings"."ac_resistance_mohm" is null or "readings"."ac_resistance_mohm" > 0)
);
--> statement-breakpoint
CREATE TABLE "decisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"evaluation_id" bigint,
	"kind" text NOT NULL,
	"from_status" "lot_status" NOT NULL,
	"to_status" "lot_status" NOT NULL,
	"reason" text,
	"signature" jsonb,
	"decided_by" text,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "evaluations" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"lot_id" uuid NOT NULL,
	"model_id" uuid,
	"model_version" text NOT NULL,
	"severity" "inspection_severity" NOT NULL,
	"plan" jsonb NOT NULL,
	"inputs" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"disposition" "disposition" NOT NULL,
	"safety" boolean DEFAULT false NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notice_responses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"notice_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"comment" text NOT NULL,
	"document_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lot_id" uuid NOT NULL,
	"decision_id" uuid,
	"organisation_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"recipients" text[] NOT NULL,
	"subject" text NOT NULL,
	"body_text" text NOT NULL,
	"body_html" text NOT NULL,
	"status" "notice_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_error" text,
	"message_id" text,
	"sent_at" timestamp with time zone,
	"acknowledged_at" timestamp with time zone,
	"acknowledged_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_id" text,
	"actor_email" text,
	"action" text NOT NULL,
	"entity_type" text,
	"entity_id" text,
	"lot_id" uuid,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"ip" text
);
--> statement-breakpoint
ALTER TABLE "supplier_contacts" ADD CONSTRAINT "supplier_contacts_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "account" ADD CONSTRAINT "account_userId_user_id_fk" FOREIGN KEY ("userId") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "password_resets" ADD CONSTRAINT "password_resets_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session" ADD CONSTRAINT "session_userId_user_id_fk" FOREIGN KEY ("userId") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "user" ADD CONSTRAINT "user_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ocv_models" ADD CONSTRAINT "ocv_models_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ocv_models" ADD CONSTRAINT "ocv_models_approved_by_user_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_supplier_id_organisations_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "parts" ADD CONSTRAINT "parts_model_id_ocv_models_id_fk" FOREIGN KEY ("model_id") REFERENCES "public"."ocv_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_resumptions" ADD CONSTRAINT "inspection_resumptions_supplier_id_organisations_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_resumptions" ADD CONSTRAINT "inspection_resumptions_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_resumptions" ADD CONSTRAINT "inspection_resumptions_resumed_by_user_id_fk" FOREIGN KEY ("resumed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_supplier_id_organisations_id_fk" FOREIGN KEY ("supplier_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lots" ADD CONSTRAINT "lots_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "documents" ADD CONSTRAINT "documents_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "documents" ADD CONSTRAINT "documents_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_imports" ADD CONSTRAINT "reading_imports_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_imports" ADD CONSTRAINT "reading_imports_imported_by_user_id_fk" FOREIGN KEY ("imported_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_import_id_reading_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."reading_imports"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_entered_by_user_id_fk" FOREIGN KEY ("entered_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decisions" ADD CONSTRAINT "decisions_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decisions" ADD CONSTRAINT "decisions_evaluation_id_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."evaluations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decisions" ADD CONSTRAINT "decisions_decided_by_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evaluations" ADD CONSTRAINT "evaluations_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evaluations" ADD CONSTRAINT "evaluations_model_id_ocv_models_id_fk" FOREIGN KEY ("model_id") REFERENCES "public"."ocv_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "evaluations" ADD CONSTRAINT "evaluations_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_responses" ADD CONSTRAINT "notice_responses_notice_id_notices_id_fk" FOREIGN KEY ("notice_id") REFERENCES "public"."notices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_responses" ADD CONSTRAINT "notice_responses_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_responses" ADD CONSTRAINT "notice_responses_document_id_documents_id_fk" FOREIGN KEY ("document_id") REFERENCES "public"."documents"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notices" ADD CONSTRAINT "notices_lot_id_lots_id_fk" FOREIGN KEY ("lot_id") REFERENCES "public"."lots"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notices" ADD CONSTRAINT "notices_decision_id_decisions_id_fk" FOREIGN KEY ("decision_id") REFERENCES "public"."decisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notices" ADD CONSTRAINT "notices_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notices" ADD CONSTRAINT "notices_acknowledged_by_user_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "supplier_contacts_org_idx" ON "supplier_contacts" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "sign_in_failures_key_at_idx" ON "sign_in_failures" USING btree ("throttle_key","at");--> statement-breakpoint
CREATE INDEX "user_org_idx" ON "user" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "api_tokens_user_idx" ON "api_tokens" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "parts_supplier_idx" ON "parts" USING btree ("supplier_id");--> statement-breakpoint
CREATE INDEX "lots_created_idx" ON "lots" USING btree ("created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "lots_status_created_idx" ON "lots" USING btree ("status","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "lots_supplier_created_idx" ON "lots" USING btree ("supplier_id","created_at" DESC NULLS LAST,"id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "lots_part_decided_idx" ON "lots" USING btree ("supplier_id","part_id","decided_at");--> statement-breakpoint
CREATE INDEX "documents_lot_idx" ON "documents" USING btree ("lot_id");--> statement-breakpoint
CREATE INDEX "readings_lot_serial_idx" ON "readings" USING btree ("lot_id","serial","measured_at");--> statement-breakpoint
CREATE INDEX "decisions_lot_idx" ON "decisions" USING btree ("lot_id","decided_at");--> statement-breakpoint
CREATE INDEX "evaluations_lot_idx" ON "evaluations" USING btree ("lot_id","created_at");--> statement-breakpoint
CREATE INDEX "notice_responses_notice_idx" ON "notice_responses" USING btree ("notice_id");--> statement-breakpoint
CREATE INDEX "notices_outbox_idx" ON "notices" USING btree ("status","next_attempt_at");--> statement-breakpoint
CREATE INDEX "notices_lot_idx" ON "notices" USING btree ("lot_id");--> statement-breakpoint
CREATE INDEX "notices_org_idx" ON "notices" USING btree ("organisation_id","created_at");--> statement-breakpoint
CREATE INDEX "audit_events_lot_idx" ON "audit_events" USING btree ("lot_id","at");--> statement-breakpoint
CREATE INDEX "audit_events_action_idx" ON "audit_events" USING btree ("action","at");