CREATE TABLE "decision_revision" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"chosen_candidate_id" uuid,
	"rationale" text DEFAULT '' NOT NULL,
	"assumptions" text DEFAULT '' NOT NULL,
	"rejected" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"dissent" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"actions" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"snapshot" jsonb,
	"signed_by_id" text,
	"signed_by_name" text,
	"signed_at" timestamp with time zone,
	"updated_by_id" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "decision_signed_complete" CHECK ("decision_revision"."status" = 'draft' or ("decision_revision"."signed_at" is not null and "decision_revision"."snapshot" is not null))
);
--> statement-breakpoint
CREATE TABLE "file_blob" (
	"storage_key" text PRIMARY KEY NOT NULL,
	"bytes" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "score" (
	"review_id" uuid NOT NULL,
	"candidate_id" uuid NOT NULL,
	"criterion_id" text NOT NULL,
	"user_id" text NOT NULL,
	"score" integer NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "score_candidate_id_criterion_id_user_id_pk" PRIMARY KEY("candidate_id","criterion_id","user_id"),
	CONSTRAINT "score_between_1_and_5" CHECK ("score"."score" between 1 and 5)
);
--> statement-breakpoint
CREATE TABLE "stored_file" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"candidate_id" uuid,
	"name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"driver" text NOT NULL,
	"storage_key" text NOT NULL,
	"uploaded_by_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stored_file_size" CHECK ("stored_file"."size_bytes" between 1 and 20971520)
);
--> statement-breakpoint
ALTER TABLE "user_setting" ADD COLUMN "daily_digest" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "user_setting" ADD COLUMN "digest_sent_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "decision_revision" ADD CONSTRAINT "decision_revision_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decision_revision" ADD CONSTRAINT "decision_revision_signed_by_id_user_id_fk" FOREIGN KEY ("signed_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "decision_revision" ADD CONSTRAINT "decision_revision_updated_by_id_user_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "score" ADD CONSTRAINT "score_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "score" ADD CONSTRAINT "score_candidate_id_candidate_id_fk" FOREIGN KEY ("candidate_id") REFERENCES "public"."candidate"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "score" ADD CONSTRAINT "score_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stored_file" ADD CONSTRAINT "stored_file_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stored_file" ADD CONSTRAINT "stored_file_candidate_id_candidate_id_fk" FOREIGN KEY ("candidate_id") REFERENCES "public"."candidate"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stored_file" ADD CONSTRAINT "stored_file_uploaded_by_id_user_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "decision_review_number_key" ON "decision_revision" USING btree ("review_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "decision_one_draft_key" ON "decision_revision" USING btree ("review_id") WHERE "decision_revision"."status" = 'draft';--> statement-breakpoint
CREATE INDEX "score_review_idx" ON "score" USING btree ("review_id");--> statement-breakpoint
CREATE INDEX "stored_file_review_idx" ON "stored_file" USING btree ("review_id","created_at");