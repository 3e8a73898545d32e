CREATE TABLE "ballot" (
	"round_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"votes" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "ballot_round_user_pk" PRIMARY KEY("round_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "candidate" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"name" text NOT NULL,
	"colour_index" integer NOT NULL,
	"status" text DEFAULT 'proposed' NOT NULL,
	"preset" text,
	"parameters" jsonb NOT NULL,
	"input" jsonb NOT NULL,
	"results" jsonb,
	"error" jsonb,
	"revision" integer DEFAULT 1 NOT NULL,
	"position" integer NOT NULL,
	"created_by_id" text,
	"updated_by_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "candidate_results_or_error" CHECK ("candidate"."results" is null or "candidate"."error" is null)
);
--> statement-breakpoint
CREATE TABLE "comment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"candidate_id" uuid,
	"parent_id" uuid,
	"author_id" text,
	"body" text NOT NULL,
	"mentions" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"client_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "comment_body_length" CHECK (char_length("comment"."body") between 1 and 5000)
);
--> statement-breakpoint
CREATE TABLE "design_basis" (
	"review_id" uuid PRIMARY KEY NOT NULL,
	"basis" jsonb NOT NULL,
	"criteria" jsonb NOT NULL,
	"revision" integer DEFAULT 1 NOT NULL,
	"updated_by_id" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "preference_round" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"votes_per_person" integer NOT NULL,
	"blind" boolean NOT NULL,
	"opened_by_id" text,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"closed_at" timestamp with time zone,
	CONSTRAINT "round_votes_positive" CHECK ("preference_round"."votes_per_person" between 1 and 20)
);
--> statement-breakpoint
ALTER TABLE "ballot" ADD CONSTRAINT "ballot_round_id_preference_round_id_fk" FOREIGN KEY ("round_id") REFERENCES "public"."preference_round"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ballot" ADD CONSTRAINT "ballot_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "candidate" ADD CONSTRAINT "candidate_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "candidate" ADD CONSTRAINT "candidate_created_by_id_user_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "candidate" ADD CONSTRAINT "candidate_updated_by_id_user_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comment" ADD CONSTRAINT "comment_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comment" ADD CONSTRAINT "comment_candidate_id_candidate_id_fk" FOREIGN KEY ("candidate_id") REFERENCES "public"."candidate"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comment" ADD CONSTRAINT "comment_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comment" ADD CONSTRAINT "comment_parent_fk" FOREIGN KEY ("parent_id") REFERENCES "public"."comment"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_basis" ADD CONSTRAINT "design_basis_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_basis" ADD CONSTRAINT "design_basis_updated_by_id_user_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "preference_round" ADD CONSTRAINT "preference_round_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "preference_round" ADD CONSTRAINT "preference_round_opened_by_id_user_id_fk" FOREIGN KEY ("opened_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "candidate_review_name_key" ON "candidate" USING btree ("review_id",lower("name"));--> statement-breakpoint
CREATE UNIQUE INDEX "candidate_review_colour_key" ON "candidate" USING btree ("review_id","colour_index");--> statement-breakpoint
CREATE INDEX "candidate_review_idx" ON "candidate" USING btree ("review_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "comment_author_client_key" ON "comment" USING btree ("review_id","author_id","client_id");--> statement-breakpoint
CREATE INDEX "comment_review_idx" ON "comment" USING btree ("review_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "round_review_number_key" ON "preference_round" USING btree ("review_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "round_one_open_key" ON "preference_round" USING btree ("review_id") WHERE "preference_round"."status" = 'open';