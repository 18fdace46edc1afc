ALTER TABLE "mail_message" ADD COLUMN "attachments" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "bench_step_result" ADD COLUMN "failure_mailed_at" timestamp with time zone;