CREATE TABLE "training_record" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"topic" text NOT NULL,
	"completed_on" date NOT NULL,
	"expires_on" date,
	"notes" text DEFAULT '' NOT NULL,
	"recorded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"withdrawn_at" timestamp with time zone,
	"withdrawn_reason" text
);
--> statement-breakpoint
ALTER TABLE "training_record" ADD CONSTRAINT "training_record_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "training_record" ADD CONSTRAINT "training_record_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "training_record_user_idx" ON "training_record" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "training_record_expires_idx" ON "training_record" USING btree ("expires_on");