CREATE TABLE "register_import" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"created_by" text NOT NULL,
	"file_name" text NOT NULL,
	"state" text DEFAULT 'preview' NOT NULL,
	"valid_only" boolean DEFAULT false NOT NULL,
	"total_rows" integer NOT NULL,
	"error_rows" integer NOT NULL,
	"new_lasers" integer DEFAULT 0 NOT NULL,
	"existing_lasers" integer DEFAULT 0 NOT NULL,
	"problems" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"processed_rows" integer DEFAULT 0 NOT NULL,
	"lasers_created" integer DEFAULT 0 NOT NULL,
	"lasers_updated" integer DEFAULT 0 NOT NULL,
	"lines_added" integer DEFAULT 0 NOT NULL,
	"lines_updated" integer DEFAULT 0 NOT NULL,
	"lines_unchanged" integer DEFAULT 0 NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"queued_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "register_import_row" (
	"import_id" uuid NOT NULL,
	"line" integer NOT NULL,
	"laser_key" text NOT NULL,
	"data" jsonb NOT NULL,
	"done" boolean DEFAULT false NOT NULL,
	CONSTRAINT "register_import_row_import_id_line_pk" PRIMARY KEY("import_id","line")
);
--> statement-breakpoint
ALTER TABLE "register_import" ADD CONSTRAINT "register_import_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "register_import_row" ADD CONSTRAINT "register_import_row_import_id_register_import_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."register_import"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "register_import_state_idx" ON "register_import" USING btree ("state","queued_at");