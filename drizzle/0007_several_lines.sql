CREATE TYPE "public"."wavelength_factor_kind" AS ENUM('none', 'constant', 'exponential');--> statement-breakpoint
CREATE TABLE "path_line" (
	"path_id" uuid NOT NULL,
	"line_id" uuid NOT NULL,
	"sequence" integer NOT NULL,
	CONSTRAINT "path_line_path_id_line_id_pk" PRIMARY KEY("path_id","line_id")
);
--> statement-breakpoint
ALTER TABLE "beam_path" DROP CONSTRAINT "beam_path_line_id_emission_line_id_fk";
--> statement-breakpoint
DROP INDEX "beam_path_line_idx";--> statement-breakpoint
ALTER TABLE "beam_path" ADD COLUMN "line_choice_reason" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "emission_line" ADD COLUMN "emission_group" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "path_element" ADD COLUMN "bands" jsonb;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_kind" "wavelength_factor_kind" DEFAULT 'none' NOT NULL;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_value" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_slope" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_origin" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_from" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "wavelength_factor_to" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "extended_alpha_min" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "extended_alpha_max" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "extended_exponent" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "limiting_aperture_exponent" numeric DEFAULT '0' NOT NULL;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "pulse_grouping_time" numeric;--> statement-breakpoint
ALTER TABLE "required_control" ADD COLUMN "wavelength_max" numeric;--> statement-breakpoint
ALTER TABLE "path_line" ADD CONSTRAINT "path_line_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "path_line" ADD CONSTRAINT "path_line_line_id_emission_line_id_fk" FOREIGN KEY ("line_id") REFERENCES "public"."emission_line"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "path_line_line_idx" ON "path_line" USING btree ("line_id");--> statement-breakpoint
-- Every existing path keeps its line: written by hand, before the column goes.
INSERT INTO "path_line" ("path_id", "line_id", "sequence") SELECT "id", "line_id", 0 FROM "beam_path";--> statement-breakpoint
ALTER TABLE "beam_path" DROP COLUMN "line_id";