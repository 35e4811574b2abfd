ALTER TABLE "api_tokens" ADD COLUMN "parent_id" text;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD COLUMN "expires_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_parent_id_api_tokens_id_fk" FOREIGN KEY ("parent_id") REFERENCES "public"."api_tokens"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "api_tokens_parent_idx" ON "api_tokens" USING btree ("parent_id");