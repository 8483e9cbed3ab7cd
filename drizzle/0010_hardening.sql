CREATE TABLE "app_secret" (
	"name" text PRIMARY KEY NOT NULL,
	"value" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "password_reset_request" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"address" text NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL,
	"processed_at" timestamp with time zone
);
--> statement-breakpoint
CREATE INDEX "password_reset_request_email_idx" ON "password_reset_request" USING btree ("email","requested_at");--> statement-breakpoint
CREATE INDEX "password_reset_request_address_idx" ON "password_reset_request" USING btree ("address","requested_at");--> statement-breakpoint
CREATE INDEX "sign_in_throttle_window_idx" ON "sign_in_throttle" USING btree ("window_start");--> statement-breakpoint
CREATE INDEX "beam_path_review_queue_idx" ON "beam_path" USING btree ("review_state",coalesce("awaiting_since", "updated_at"),"id");--> statement-breakpoint
CREATE INDEX "laser_model_idx" ON "laser" USING btree ("model","id");