CREATE TYPE "public"."fault_disposition_kind" AS ENUM('accepted', 'fix-next-revision', 'ruled-out');--> statement-breakpoint
CREATE TABLE "fault_disposition" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"design_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"content_hash" text NOT NULL,
	"component" text NOT NULL,
	"mode" text NOT NULL,
	"disposition" "fault_disposition_kind" NOT NULL,
	"justification" text NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fault_disposition_mode" CHECK ("fault_disposition"."mode" IN ('stuck-open', 'stuck-closed'))
);
--> statement-breakpoint
ALTER TABLE "fault_disposition" ADD CONSTRAINT "fault_disposition_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_disposition" ADD CONSTRAINT "fault_disposition_design_id_design_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."design"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_disposition" ADD CONSTRAINT "fault_disposition_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_disposition" ADD CONSTRAINT "fault_disposition_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fault_disposition_revision_idx" ON "fault_disposition" USING btree ("revision_id","created_at");--> statement-breakpoint
CREATE INDEX "fault_disposition_workspace_idx" ON "fault_disposition" USING btree ("workspace_id");