CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE TYPE "public"."beam_definition" AS ENUM('1/e', '1/e2', 'fwhm');--> statement-breakpoint
CREATE TYPE "public"."element_kind" AS ENUM('propagate', 'transmission', 'mirror', 'expander', 'lens', 'fibre', 'enclosure');--> statement-breakpoint
CREATE TYPE "public"."emission_mode" AS ENUM('continuous', 'single_pulse', 'repetitive');--> statement-breakpoint
CREATE TYPE "public"."laser_class" AS ENUM('1', '1M', '2', '2M', '3R', '3B', '4');--> statement-breakpoint
CREATE TYPE "public"."laser_status" AS ENUM('active', 'in_storage', 'retired');--> statement-breakpoint
CREATE TYPE "public"."point_kind" AS ENUM('intrabeam', 'diffuse');--> statement-breakpoint
CREATE TYPE "public"."tissue" AS ENUM('eye', 'skin');--> statement-breakpoint
CREATE TYPE "public"."verdict" AS ENUM('within_limit', 'exceeds_limit', 'no_applicable_limit', 'incomplete');--> statement-breakpoint
CREATE TYPE "public"."limit_quantity" AS ENUM('irradiance', 'radiant_exposure');--> statement-breakpoint
CREATE TYPE "public"."pulse_basis" AS ENUM('single_pulse', 'continuous');--> statement-breakpoint
CREATE TABLE "area" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"name" text NOT NULL,
	"building" text DEFAULT '' NOT NULL,
	"room" text DEFAULT '' NOT NULL,
	"responsible_id" text,
	"interlock_notes" text DEFAULT '' NOT NULL,
	"signage_notes" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "beam_path" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"laser_id" uuid NOT NULL,
	"line_id" uuid NOT NULL,
	"name" text NOT NULL,
	"purpose" text DEFAULT '' NOT NULL,
	"nohd_exposure_duration" numeric,
	"verdict" "verdict",
	"flagged" boolean DEFAULT false NOT NULL,
	"stale" boolean DEFAULT false NOT NULL,
	"retired" boolean DEFAULT false NOT NULL,
	"created_by" text,
	"updated_by" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "emission_line" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"laser_id" uuid NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"mode" "emission_mode" NOT NULL,
	"wavelength" numeric NOT NULL,
	"wavelength_max" numeric,
	"power" numeric,
	"pulse_energy" numeric,
	"pulse_duration" numeric,
	"repetition_rate" numeric,
	"beam_diameter" numeric NOT NULL,
	"beam_diameter_definition" "beam_definition" NOT NULL,
	"divergence" numeric NOT NULL,
	"divergence_definition" "beam_definition" NOT NULL,
	"beam_quality" numeric,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "laser" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"area_id" uuid,
	"maker" text NOT NULL,
	"model" text NOT NULL,
	"serial" text DEFAULT '' NOT NULL,
	"laser_class" "laser_class" NOT NULL,
	"status" "laser_status" DEFAULT 'active' NOT NULL,
	"owner_id" text,
	"notes" text DEFAULT '' NOT NULL,
	"wavelength_min" numeric,
	"wavelength_max" numeric,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "path_element" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"path_id" uuid NOT NULL,
	"sequence" integer NOT NULL,
	"kind" "element_kind" NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"length" numeric,
	"transmission" numeric,
	"reflectance" numeric,
	"magnification" numeric,
	"focal_length" numeric,
	"core_diameter" numeric,
	"numerical_aperture" numeric,
	"coupling_transmission" numeric
);
--> statement-breakpoint
CREATE TABLE "point_of_concern" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"path_id" uuid NOT NULL,
	"sequence" integer NOT NULL,
	"label" text NOT NULL,
	"kind" "point_kind" NOT NULL,
	"tissue" "tissue" NOT NULL,
	"position" numeric NOT NULL,
	"exposure_duration" numeric,
	"reflectance" numeric,
	"viewing_angle" numeric,
	"viewing_distance" numeric
);
--> statement-breakpoint
CREATE TABLE "assessment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"path_id" uuid NOT NULL,
	"path_version" integer NOT NULL,
	"engine_version" text NOT NULL,
	"inputs" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"verdict" "verdict" NOT NULL,
	"worst_ratio" numeric,
	"required_od" numeric,
	"limit_versions" jsonb NOT NULL,
	"cause" text DEFAULT 'save' NOT NULL,
	"stale" boolean DEFAULT false NOT NULL,
	"stale_reason" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "exposure_limit" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"current_version" integer DEFAULT 1 NOT NULL,
	"retired" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "exposure_limit_version" (
	"limit_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"label" text NOT NULL,
	"tissue" "tissue" NOT NULL,
	"wavelength_min" numeric NOT NULL,
	"wavelength_max" numeric NOT NULL,
	"duration_min" numeric NOT NULL,
	"duration_max" numeric NOT NULL,
	"quantity" "limit_quantity" NOT NULL,
	"k" numeric NOT NULL,
	"n" numeric NOT NULL,
	"limiting_aperture" numeric NOT NULL,
	"pulse_basis" "pulse_basis" NOT NULL,
	"pulse_train_exponent" numeric,
	"citation" text NOT NULL,
	"demonstration" boolean DEFAULT false NOT NULL,
	"valid_from" timestamp with time zone,
	"valid_until" timestamp with time zone,
	"stale_marked" integer DEFAULT 0 NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "exposure_limit_version_limit_id_version_pk" PRIMARY KEY("limit_id","version")
);
--> statement-breakpoint
ALTER TABLE "area" ADD CONSTRAINT "area_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "area" ADD CONSTRAINT "area_responsible_id_user_id_fk" FOREIGN KEY ("responsible_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "beam_path" ADD CONSTRAINT "beam_path_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "beam_path" ADD CONSTRAINT "beam_path_line_id_emission_line_id_fk" FOREIGN KEY ("line_id") REFERENCES "public"."emission_line"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "beam_path" ADD CONSTRAINT "beam_path_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "beam_path" ADD CONSTRAINT "beam_path_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "emission_line" ADD CONSTRAINT "emission_line_laser_id_laser_id_fk" FOREIGN KEY ("laser_id") REFERENCES "public"."laser"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser" ADD CONSTRAINT "laser_lab_id_lab_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."lab"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser" ADD CONSTRAINT "laser_area_id_area_id_fk" FOREIGN KEY ("area_id") REFERENCES "public"."area"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "laser" ADD CONSTRAINT "laser_owner_id_user_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "path_element" ADD CONSTRAINT "path_element_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "point_of_concern" ADD CONSTRAINT "point_of_concern_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessment" ADD CONSTRAINT "assessment_path_id_beam_path_id_fk" FOREIGN KEY ("path_id") REFERENCES "public"."beam_path"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assessment" ADD CONSTRAINT "assessment_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD CONSTRAINT "exposure_limit_version_limit_id_exposure_limit_id_fk" FOREIGN KEY ("limit_id") REFERENCES "public"."exposure_limit"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD CONSTRAINT "exposure_limit_version_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "area_lab_idx" ON "area" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "beam_path_laser_idx" ON "beam_path" USING btree ("laser_id");--> statement-breakpoint
CREATE INDEX "beam_path_line_idx" ON "beam_path" USING btree ("line_id");--> statement-breakpoint
CREATE INDEX "beam_path_flagged_idx" ON "beam_path" USING btree ("flagged","stale");--> statement-breakpoint
CREATE INDEX "emission_line_laser_idx" ON "emission_line" USING btree ("laser_id");--> statement-breakpoint
CREATE INDEX "laser_lab_status_idx" ON "laser" USING btree ("lab_id","status");--> statement-breakpoint
CREATE INDEX "laser_class_idx" ON "laser" USING btree ("laser_class");--> statement-breakpoint
CREATE INDEX "laser_wavelength_idx" ON "laser" USING btree ("wavelength_min","wavelength_max");--> statement-breakpoint
CREATE INDEX "laser_updated_idx" ON "laser" USING btree ("updated_at");--> statement-breakpoint
CREATE INDEX "laser_search_idx" ON "laser" USING gin (("maker" || ' ' || "model" || ' ' || "serial") gin_trgm_ops);--> statement-breakpoint
CREATE UNIQUE INDEX "path_element_order_idx" ON "path_element" USING btree ("path_id","sequence");--> statement-breakpoint
CREATE UNIQUE INDEX "point_of_concern_order_idx" ON "point_of_concern" USING btree ("path_id","sequence");--> statement-breakpoint
CREATE INDEX "assessment_path_idx" ON "assessment" USING btree ("path_id","created_at");--> statement-breakpoint
CREATE INDEX "assessment_stale_idx" ON "assessment" USING btree ("stale");--> statement-breakpoint
CREATE INDEX "limit_version_tissue_idx" ON "exposure_limit_version" USING btree ("tissue");