CREATE TABLE "site_year" (
	"review_id" uuid PRIMARY KEY NOT NULL,
	"columns" jsonb NOT NULL,
	"rows" integer NOT NULL,
	"hours" double precision NOT NULL,
	"min_k" double precision NOT NULL,
	"max_k" double precision NOT NULL,
	"mean_k" double precision NOT NULL,
	"file_name" text NOT NULL,
	"uploaded_by_id" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_year_rows_check" CHECK ("site_year"."rows" > 0),
	CONSTRAINT "site_year_hours_check" CHECK ("site_year"."hours" > 0),
	CONSTRAINT "site_year_range_check" CHECK ("site_year"."min_k" <= "site_year"."mean_k" and "site_year"."mean_k" <= "site_year"."max_k")
);
--> statement-breakpoint
ALTER TABLE "site_year" ADD CONSTRAINT "site_year_review_id_review_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."review"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_year" ADD CONSTRAINT "site_year_uploaded_by_id_user_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;