CREATE TYPE "public"."part_line" AS ENUM('upper', 'lower');--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "line" "part_line" DEFAULT 'upper' NOT NULL;--> statement-breakpoint
ALTER TABLE "parts" ADD COLUMN "line_analysis" jsonb;