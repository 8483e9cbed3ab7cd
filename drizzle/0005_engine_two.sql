CREATE TYPE "public"."beam_profile" AS ENUM('gaussian', 'flat_top');--> statement-breakpoint
ALTER TABLE "emission_line" ADD COLUMN "beam_profile" "beam_profile" DEFAULT 'gaussian' NOT NULL;--> statement-breakpoint
ALTER TABLE "emission_line" ADD COLUMN "hot_spot_factor" numeric;--> statement-breakpoint
ALTER TABLE "exposure_limit_version" ADD COLUMN "no_train_correction" boolean DEFAULT false NOT NULL;