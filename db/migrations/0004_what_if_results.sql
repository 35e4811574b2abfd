CREATE TABLE "what_if_results" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"engine_version" text NOT NULL,
	"input_key" text NOT NULL,
	"input" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "what_if_results_key_unique" UNIQUE("revision_id","engine_version","input_key")
);
--> statement-breakpoint
ALTER TABLE "what_if_results" ADD CONSTRAINT "what_if_results_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "what_if_results_created_idx" ON "what_if_results" USING btree ("created_at");