CREATE TABLE "job_run" (
	"queue" text PRIMARY KEY NOT NULL,
	"last_finished_at" timestamp with time zone NOT NULL,
	"last_result" jsonb DEFAULT '{}'::jsonb NOT NULL
);
--> statement-breakpoint
ALTER TABLE "finding" ADD COLUMN "closed_by" text;--> statement-breakpoint
ALTER TABLE "finding" ADD COLUMN "closure_note" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "finding" ADD COLUMN "version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "finding" ADD CONSTRAINT "finding_closed_by_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;