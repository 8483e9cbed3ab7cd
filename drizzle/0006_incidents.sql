CREATE TYPE "public"."incident_kind" AS ENUM('eye_exposure', 'skin_exposure', 'near_miss', 'fire_or_damage', 'non_beam');--> statement-breakpoint
CREATE TYPE "public"."incident_state" AS ENUM('draft', 'reported', 'investigating', 'closed');--> statement-breakpoint
CREATE TYPE "public"."medical_attention" AS ENUM('sought', 'not_sought', 'unknown');--> statement-breakpoint
CREATE TYPE "public"."incident_severity" AS ENUM('caught', 'slight', 'serious', 'grave');--> statement-breakpoint
CREATE TABLE "corrective_action" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"incident_id" uuid NOT NULL,
	"description" text NOT NULL,
	"owner_id" text NOT NULL,
	"due_on" date NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"evidence" text DEFAULT '' NOT NULL,
	"closed_by" text,
	"closed_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "incident" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"number" serial NOT NULL,
	"state" "incident_state" DEFAULT 'draft' NOT NULL,
	"kind" "incident_kind",
	"occurred_at" timestamp,
	"lab_id" uuid,
	"area_id" uuid,
	"laser_id" uuid,
	"path_id" uuid,
	"location_notes" text DEFAULT '' NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"people_involved" text DEFAULT '' NOT NULL,
	"medical_attention" "medical_attention" DEFAULT 'unknown' NOT NULL,
	"anonymous" boolean DEFAULT false NOT NULL,
	"reported_by" text NOT NULL,
	"submitted_at" timestamp with time zone,
	"severity" "incident_severity",
	"causes" text DEFAULT '' NOT NULL,
	"factors" text[] DEFAULT '{}'::text[] NOT NULL,
	"investigated_by" text,
	"investigated_at" timestamp with time zone,
	"closed_by" text,
	"closed_at" timestamp with time zone,
	"closing_note" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "incident_number_unique" UNIQUE("number"),
	CONSTRAINT "incident_submitted_complete" CHECK ("incident"."state" = 'draft' OR ("incident"."kind" IS NOT NULL AND "incident"."occurred_at" IS NOT NULL AND "incident"."lab_id" IS NOT NULL AND "incident"."submitted_at" IS NOT NULL))
);
--> statement-breakpoint
CREATE TABLE "incident_link" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"incident_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"path_id" uuid,
	"eyewear_id" uuid,
	"reference" text,
	CONSTRAINT "incident_link_target" CHECK (("incident_link"."kind" = 'path' AND "incident_link"."path_id" IS NOT NULL) OR ("incident_link"."kind" = 'eyewear' AND "incident_link"."eyewear_id" IS NOT NULL) OR ("incident_link"."kind" = 'procedure' AND "incident_link"."reference" IS NOT NULL))
);
--> statement-breakpoint
CREATE TABLE "incident_medical" (
	"incident_id" uuid PRIMARY KEY NOT NULL,
	"examination_requested_on" date,
	"examination_done_on" date,
	"outcome" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "laser_suspension" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"laser_id" uuid NOT NULL,
	"incident_id" uuid,
	"reason" text NOT NULL,
	"suspended_by" text NOT NULL,
	"suspended_at" timestamp with time zone DEFAULT now() NOT NULL,
	"lifted_by" text,
	"lifted_at" timestamp with time zone,
	"lift_reason" text
);
--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_incident_id_incident_id_fk" FOREIGN KEY ("incident_id") REFERENCES "public"."incident"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_owner_id_user_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_action" ADD CONSTRAINT "corrective_action_closed_by_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_area_id_area_id_fk" FOREIGN KEY ("area_id") REFERENCES "public"."area"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_reported_by_user_id_fk" FOREIGN KEY ("reported_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_investigated_by_user_id_fk" FOREIGN KEY ("investigated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident" ADD CONSTRAINT "incident_closed_by_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident_link" ADD CONSTRAINT "incident_link_incident_id_incident_id_fk" FOREIGN KEY ("incident_id") REFERENCES "public"."incident"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident_link" ADD CONSTRAINT "incident_link_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident_link" ADD CONSTRAINT "incident_link_eyewear_id_eyewear_id_fk" FOREIGN KEY ("eyewear_id") REFERENCES "public"."eyewear"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident_medical" ADD CONSTRAINT "incident_medical_incident_id_incident_id_fk" FOREIGN KEY ("incident_id") REFERENCES "public"."incident"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "incident_medical" ADD CONSTRAINT "incident_medical_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_suspension" ADD CONSTRAINT "laser_suspension_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_suspension" ADD CONSTRAINT "laser_suspension_incident_id_incident_id_fk" FOREIGN KEY ("incident_id") REFERENCES "public"."incident"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_suspension" ADD CONSTRAINT "laser_suspension_suspended_by_user_id_fk" FOREIGN KEY ("suspended_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser_suspension" ADD CONSTRAINT "laser_suspension_lifted_by_user_id_fk" FOREIGN KEY ("lifted_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "corrective_action_incident_idx" ON "corrective_action" USING btree ("incident_id");--> statement-breakpoint
CREATE INDEX "corrective_action_open_idx" ON "corrective_action" USING btree ("closed_at","due_on");--> statement-breakpoint
CREATE INDEX "corrective_action_owner_idx" ON "corrective_action" USING btree ("owner_id");--> statement-breakpoint
CREATE INDEX "incident_state_idx" ON "incident" USING btree ("state");--> statement-breakpoint
CREATE INDEX "incident_lab_idx" ON "incident" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "incident_reporter_idx" ON "incident" USING btree ("reported_by");--> statement-breakpoint
CREATE INDEX "incident_occurred_idx" ON "incident" USING btree ("occurred_at");--> statement-breakpoint
CREATE INDEX "incident_link_incident_idx" ON "incident_link" USING btree ("incident_id");--> statement-breakpoint
CREATE UNIQUE INDEX "laser_suspension_open_idx" ON "laser_suspension" USING btree ("laser_id") WHERE "laser_suspension"."lifted_at" IS NULL;--> statement-breakpoint
CREATE INDEX "laser_suspension_incident_idx" ON "laser_suspension" USING btree ("incident_id");