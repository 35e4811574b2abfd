-- Search: topology-only fingerprints (recomputed by the worker's backfill at start for every row
-- whose fingerprint_version is behind the engine's), value features, fragment features and the
-- stored structure fragment search confirms on, tags, the mismatch and supply facets, and
-- comments' text. New columns come first, because the regenerated search_vector reads
-- search_tags; dropping search_vector drops its index, so it is made again.
ALTER TABLE "entries" ADD COLUMN "value_features" integer[] DEFAULT '{}'::integer[] NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "fragment_features" integer[] DEFAULT '{}'::integer[] NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "topology" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "fingerprint_version" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "search_tags" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "has_mismatch" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "search_supply" text GENERATED ALWAYS AS (("entries"."facets" ->> 'supply_vrms') || '/' || ("entries"."facets" ->> 'supply_hz')) STORED;--> statement-breakpoint
ALTER TABLE "entries" DROP COLUMN "search_vector";--> statement-breakpoint
ALTER TABLE "entries" ADD COLUMN "search_vector" "tsvector" GENERATED ALWAYS AS (setweight(to_tsvector('simple', coalesce("entries"."title", '')), 'A') || setweight(to_tsvector('simple', coalesce("entries"."category", '') || ' ' || "entries"."search_tags"), 'B') || setweight(to_tsvector('simple', "entries"."search_text"), 'C')) STORED;--> statement-breakpoint
ALTER TABLE "comments" ADD COLUMN "search_vector" "tsvector" GENERATED ALWAYS AS (to_tsvector('simple', "comments"."body")) STORED;--> statement-breakpoint
CREATE INDEX "entries_search_vector_idx" ON "entries" USING gin ("search_vector");--> statement-breakpoint
CREATE INDEX "entries_fragment_features_idx" ON "entries" USING gin ("fragment_features");--> statement-breakpoint
CREATE INDEX "entries_fingerprint_version_idx" ON "entries" USING btree ("fingerprint_version");--> statement-breakpoint
CREATE INDEX "comments_search_vector_idx" ON "comments" USING gin ("search_vector");
