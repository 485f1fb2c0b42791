CREATE TYPE "public"."assignment_drill" AS ENUM('pulse-trainer', 'hold-ladder', 'take', 'free');--> statement-breakpoint
ALTER TYPE "public"."token_purpose" ADD VALUE 'sign_in_link';--> statement-breakpoint
ALTER TYPE "public"."proposal_status" ADD VALUE 'withdrawn';--> statement-breakpoint
CREATE TABLE "practice_assignments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"part_id" uuid NOT NULL,
	"assigned_by" uuid NOT NULL,
	"note_key" text,
	"drill" "assignment_drill" NOT NULL,
	"instructions" text DEFAULT '' NOT NULL,
	"minutes_per_day" integer,
	"due_on" date,
	"done_at" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "practice_assignments" ADD CONSTRAINT "practice_assignments_part_id_parts_id_fk" FOREIGN KEY ("part_id") REFERENCES "public"."parts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_assignments" ADD CONSTRAINT "practice_assignments_assigned_by_users_id_fk" FOREIGN KEY ("assigned_by") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "practice_assignments_part_idx" ON "practice_assignments" USING btree ("part_id","done_at");