ALTER TABLE "beam_path" ADD COLUMN "draft" boolean DEFAULT false NOT NULL;--> statement-breakpoint
-- Written by hand: paths whose latest snapshot leaves an accessible point incomplete become drafts
-- (off the review desk until completed), as a save would mark them now.
UPDATE "beam_path" p SET "draft" = true, "flagged" = false, "review_state" = 'not_needed', "awaiting_since" = NULL
WHERE EXISTS (
	SELECT 1 FROM (SELECT a."result" FROM "assessment" a WHERE a."path_id" = p."id" ORDER BY a."created_at" DESC LIMIT 1) latest,
		jsonb_array_elements(CASE WHEN jsonb_typeof(latest."result"->'points') = 'array' THEN latest."result"->'points' ELSE '[]'::jsonb END) pt
	WHERE pt->>'accessible' = 'true' AND jsonb_typeof(pt->'missing') = 'array' AND jsonb_array_length(pt->'missing') > 0
);
