CREATE TABLE "robustness_run" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"status" text NOT NULL,
	"samples" integer NOT NULL,
	"seed" integer NOT NULL,
	"uncertainty" jsonb NOT NULL,
	"fingerprint" text NOT NULL,
	"done" integer DEFAULT 0 NOT NULL,
	"result" jsonb,
	"message" text,
	"started_by_id" text,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"heartbeat_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone,
	CONSTRAINT "robustness_samples_range" CHECK ("robustness_run"."samples" between 1 and 20000),
	CONSTRAINT "robustness_done_range" CHECK ("robustness_run"."done" between 0 and "robustness_run"."samples")
);
--> statement-breakpoint
ALTER TABLE "robustness_run" ADD CONSTRAINT "robustness_run_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "robustness_run" ADD CONSTRAINT "robustness_run_started_by_id_user_id_fk" FOREIGN KEY ("started_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "robustness_run_review_idx" ON "robustness_run" USING btree ("review_id","started_at");--> statement-breakpoint
CREATE UNIQUE INDEX "robustness_one_running_key" ON "robustness_run" USING btree ("review_id") WHERE "robustness_run"."status" in ('running', 'cancelling');