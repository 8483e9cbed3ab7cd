CREATE TYPE "public"."procedure_kind" AS ENUM('operating', 'alignment', 'service', 'emergency');--> statement-breakpoint
CREATE TABLE "procedure" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"laser_id" uuid,
	"area_id" uuid,
	"kind" "procedure_kind" NOT NULL,
	"title" text NOT NULL,
	"owner_id" text NOT NULL,
	"review_needed" boolean DEFAULT false NOT NULL,
	"review_needed_reason" text DEFAULT '' NOT NULL,
	"review_needed_since" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "procedure_one_target" CHECK (("procedure"."laser_id" IS NULL) <> ("procedure"."area_id" IS NULL))
);
--> statement-breakpoint
CREATE TABLE "procedure_draft" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"procedure_id" uuid NOT NULL,
	"body" text DEFAULT '' NOT NULL,
	"document_id" uuid,
	"change_note" text DEFAULT '' NOT NULL,
	"state" text DEFAULT 'draft' NOT NULL,
	"submitted_by" text,
	"submitted_at" timestamp with time zone,
	"returned_comment" text DEFAULT '' NOT NULL,
	"created_by" text NOT NULL,
	"updated_by" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "procedure_path" (
	"procedure_id" uuid NOT NULL,
	"path_id" uuid NOT NULL,
	CONSTRAINT "procedure_path_procedure_id_path_id_pk" PRIMARY KEY("procedure_id","path_id")
);
--> statement-breakpoint
CREATE TABLE "procedure_signoff" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"version_id" uuid NOT NULL,
	"procedure_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "procedure_version" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"procedure_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"body" text NOT NULL,
	"document_id" uuid,
	"document_sha256" text,
	"change_note" text DEFAULT '' NOT NULL,
	"drafted_by" text NOT NULL,
	"submitted_by" text,
	"submitted_at" timestamp with time zone,
	"approved_by" text NOT NULL,
	"approved_at" timestamp with time zone DEFAULT now() NOT NULL,
	"review_by" date NOT NULL,
	"approval_comment" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "programme_setting" (
	"id" text PRIMARY KEY NOT NULL,
	"signoff_interval_months" integer DEFAULT 12 NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "authorisation" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"lab_id" uuid NOT NULL,
	"laser_id" uuid,
	"area_id" uuid,
	"decision" text NOT NULL,
	"request_note" text DEFAULT '' NOT NULL,
	"requested_by" text NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decided_by" text,
	"decided_at" timestamp with time zone,
	"decision_reason" text DEFAULT '' NOT NULL,
	"expires_on" date,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "authorisation_one_target" CHECK (("authorisation"."laser_id" IS NULL) <> ("authorisation"."area_id" IS NULL))
);
--> statement-breakpoint
CREATE TABLE "authorisation_condition" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"authorisation_id" uuid NOT NULL,
	"training_topic" text,
	"procedure_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "authorisation_condition_one" CHECK (("authorisation_condition"."training_topic" IS NULL) <> ("authorisation_condition"."procedure_id" IS NULL))
);
--> statement-breakpoint
CREATE TABLE "authorisation_lapse" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"authorisation_id" uuid NOT NULL,
	"cause" text NOT NULL,
	"since" date NOT NULL,
	"reason" text NOT NULL,
	"noticed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "visit" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"area_id" uuid NOT NULL,
	"visitor_name" text NOT NULL,
	"organisation" text DEFAULT '' NOT NULL,
	"kind" text NOT NULL,
	"starts_on" date NOT NULL,
	"ends_on" date NOT NULL,
	"escort_name" text NOT NULL,
	"briefing" text NOT NULL,
	"recorded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "procedure" ADD CONSTRAINT "procedure_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure" ADD CONSTRAINT "procedure_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure" ADD CONSTRAINT "procedure_area_id_area_id_fk" FOREIGN KEY ("area_id") REFERENCES "public"."area"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure" ADD CONSTRAINT "procedure_owner_id_user_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_draft" ADD CONSTRAINT "procedure_draft_procedure_id_procedure_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedure"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_draft" ADD CONSTRAINT "procedure_draft_document_id_document_id_fk" FOREIGN KEY ("document_id") REFERENCES "public"."document"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_draft" ADD CONSTRAINT "procedure_draft_submitted_by_user_id_fk" FOREIGN KEY ("submitted_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_draft" ADD CONSTRAINT "procedure_draft_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_draft" ADD CONSTRAINT "procedure_draft_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_path" ADD CONSTRAINT "procedure_path_procedure_id_procedure_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedure"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_path" ADD CONSTRAINT "procedure_path_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_signoff" ADD CONSTRAINT "procedure_signoff_version_id_procedure_version_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."procedure_version"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_signoff" ADD CONSTRAINT "procedure_signoff_procedure_id_procedure_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedure"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_signoff" ADD CONSTRAINT "procedure_signoff_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_version" ADD CONSTRAINT "procedure_version_procedure_id_procedure_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedure"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_version" ADD CONSTRAINT "procedure_version_document_id_document_id_fk" FOREIGN KEY ("document_id") REFERENCES "public"."document"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_version" ADD CONSTRAINT "procedure_version_drafted_by_user_id_fk" FOREIGN KEY ("drafted_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_version" ADD CONSTRAINT "procedure_version_submitted_by_user_id_fk" FOREIGN KEY ("submitted_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedure_version" ADD CONSTRAINT "procedure_version_approved_by_user_id_fk" FOREIGN KEY ("approved_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "programme_setting" ADD CONSTRAINT "programme_setting_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_area_id_area_id_fk" FOREIGN KEY ("area_id") REFERENCES "public"."area"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_requested_by_user_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation" ADD CONSTRAINT "authorisation_decided_by_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation_condition" ADD CONSTRAINT "authorisation_condition_authorisation_id_authorisation_id_fk" FOREIGN KEY ("authorisation_id") REFERENCES "public"."authorisation"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation_condition" ADD CONSTRAINT "authorisation_condition_procedure_id_procedure_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedure"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "authorisation_lapse" ADD CONSTRAINT "authorisation_lapse_authorisation_id_authorisation_id_fk" FOREIGN KEY ("authorisation_id") REFERENCES "public"."authorisation"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit" ADD CONSTRAINT "visit_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit" ADD CONSTRAINT "visit_area_id_area_id_fk" FOREIGN KEY ("area_id") REFERENCES "public"."area"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit" ADD CONSTRAINT "visit_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "procedure_lab_idx" ON "procedure" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "procedure_laser_idx" ON "procedure" USING btree ("laser_id");--> statement-breakpoint
CREATE INDEX "procedure_area_idx" ON "procedure" USING btree ("area_id");--> statement-breakpoint
CREATE UNIQUE INDEX "procedure_draft_one_idx" ON "procedure_draft" USING btree ("procedure_id");--> statement-breakpoint
CREATE INDEX "procedure_path_path_idx" ON "procedure_path" USING btree ("path_id");--> statement-breakpoint
CREATE INDEX "procedure_signoff_person_idx" ON "procedure_signoff" USING btree ("user_id","procedure_id");--> statement-breakpoint
CREATE INDEX "procedure_signoff_version_idx" ON "procedure_signoff" USING btree ("version_id");--> statement-breakpoint
CREATE UNIQUE INDEX "procedure_version_number_idx" ON "procedure_version" USING btree ("procedure_id","number");--> statement-breakpoint
CREATE INDEX "procedure_version_review_idx" ON "procedure_version" USING btree ("review_by");--> statement-breakpoint
CREATE INDEX "authorisation_user_idx" ON "authorisation" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "authorisation_laser_idx" ON "authorisation" USING btree ("laser_id");--> statement-breakpoint
CREATE INDEX "authorisation_area_idx" ON "authorisation" USING btree ("area_id");--> statement-breakpoint
CREATE INDEX "authorisation_lab_idx" ON "authorisation" USING btree ("lab_id","decision");--> statement-breakpoint
CREATE UNIQUE INDEX "authorisation_open_laser_idx" ON "authorisation" USING btree ("user_id","laser_id") WHERE "authorisation"."decision" IN ('requested', 'granted') AND "authorisation"."laser_id" IS NOT NULL;--> statement-breakpoint
CREATE UNIQUE INDEX "authorisation_open_area_idx" ON "authorisation" USING btree ("user_id","area_id") WHERE "authorisation"."decision" IN ('requested', 'granted') AND "authorisation"."area_id" IS NOT NULL;--> statement-breakpoint
CREATE INDEX "authorisation_condition_auth_idx" ON "authorisation_condition" USING btree ("authorisation_id");--> statement-breakpoint
CREATE UNIQUE INDEX "authorisation_lapse_cause_idx" ON "authorisation_lapse" USING btree ("authorisation_id","cause");--> statement-breakpoint
CREATE INDEX "visit_area_idx" ON "visit" USING btree ("area_id","starts_on");