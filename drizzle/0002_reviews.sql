CREATE TYPE "public"."control_kind" AS ENUM('eyewear', 'enclosure', 'interlock', 'signage', 'beam_stop', 'procedure', 'training', 'other');--> statement-breakpoint
CREATE TYPE "public"."decision_kind" AS ENUM('cleared', 'returned');--> statement-breakpoint
CREATE TYPE "public"."eyewear_condition" AS ENUM('good', 'worn', 'damaged');--> statement-breakpoint
CREATE TABLE "eyewear" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"label" text NOT NULL,
	"location" text DEFAULT '' NOT NULL,
	"frame" text DEFAULT '' NOT NULL,
	"condition" "eyewear_condition" DEFAULT 'good' NOT NULL,
	"last_checked_at" timestamp with time zone,
	"retired" boolean DEFAULT false NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "eyewear_band" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"eyewear_id" uuid NOT NULL,
	"wavelength_min" numeric NOT NULL,
	"wavelength_max" numeric NOT NULL,
	"od" numeric NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notification" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"kind" text NOT NULL,
	"path_id" uuid,
	"title" text NOT NULL,
	"body" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"read_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "required_control" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"decision_id" uuid NOT NULL,
	"kind" "control_kind" NOT NULL,
	"min_od" numeric,
	"wavelength" numeric,
	"details" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_decision" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"path_id" uuid NOT NULL,
	"assessment_id" uuid NOT NULL,
	"decision" "decision_kind" NOT NULL,
	"comments" text DEFAULT '' NOT NULL,
	"review_by" timestamp with time zone,
	"decided_by" text NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_reply" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"decision_id" uuid NOT NULL,
	"author_id" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "beam_path" ADD COLUMN "review_state" text DEFAULT 'not_needed' NOT NULL;--> statement-breakpoint
ALTER TABLE "beam_path" ADD COLUMN "awaiting_since" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "beam_path" ADD COLUMN "cleared_assessment_id" uuid;--> statement-breakpoint
ALTER TABLE "eyewear" ADD CONSTRAINT "eyewear_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "eyewear_band" ADD CONSTRAINT "eyewear_band_eyewear_id_eyewear_id_fk" FOREIGN KEY ("eyewear_id") REFERENCES "public"."eyewear"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notification" ADD CONSTRAINT "notification_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notification" ADD CONSTRAINT "notification_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "required_control" ADD CONSTRAINT "required_control_decision_id_review_decision_id_fk" FOREIGN KEY ("decision_id") REFERENCES "public"."review_decision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_assessment_id_assessment_id_fk" FOREIGN KEY ("assessment_id") REFERENCES "public"."assessment"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_decided_by_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_reply" ADD CONSTRAINT "review_reply_decision_id_review_decision_id_fk" FOREIGN KEY ("decision_id") REFERENCES "public"."review_decision"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_reply" ADD CONSTRAINT "review_reply_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "eyewear_lab_idx" ON "eyewear" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "eyewear_band_item_idx" ON "eyewear_band" USING btree ("eyewear_id");--> statement-breakpoint
CREATE INDEX "notification_user_idx" ON "notification" USING btree ("user_id","created_at");--> statement-breakpoint
CREATE INDEX "required_control_decision_idx" ON "required_control" USING btree ("decision_id");--> statement-breakpoint
CREATE INDEX "review_decision_path_idx" ON "review_decision" USING btree ("path_id","decided_at");--> statement-breakpoint
CREATE INDEX "beam_path_review_idx" ON "beam_path" USING btree ("review_state","awaiting_since");--> statement-breakpoint
UPDATE "beam_path" SET "review_state" = 'awaiting_review', "awaiting_since" = "updated_at" WHERE "flagged" OR "verdict" IS DISTINCT FROM 'within_limit' AND "verdict" IS NOT NULL;
