CREATE TYPE "public"."limit_import_state" AS ENUM('draft', 'published', 'discarded');--> statement-breakpoint
CREATE TABLE "limit_import" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"state" "limit_import_state" DEFAULT 'draft' NOT NULL,
	"file_name" text NOT NULL,
	"rows" jsonb NOT NULL,
	"outcome" jsonb,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decided_by" text,
	"decided_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "limit_import" ADD CONSTRAINT "limit_import_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "limit_import" ADD CONSTRAINT "limit_import_decided_by_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "limit_import_state_idx" ON "limit_import" USING btree ("state","created_at");