CREATE TABLE "design" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"vehicle_id" text,
	"name" text NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "design_id_workspace_uq" UNIQUE("id","workspace_id")
);
--> statement-breakpoint
CREATE TABLE "design_draft" (
	"design_id" text NOT NULL,
	"workspace_id" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"document" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	"check" jsonb NOT NULL,
	"base_revision" integer DEFAULT 0 NOT NULL,
	"updated_by" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "design_draft_pk" PRIMARY KEY("design_id")
);
--> statement-breakpoint
CREATE TABLE "design_revision" (
	"id" text PRIMARY KEY NOT NULL,
	"design_id" text NOT NULL,
	"workspace_id" text NOT NULL,
	"number" integer NOT NULL,
	"document" jsonb NOT NULL,
	"verdict" jsonb NOT NULL,
	"content_hash" text NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "design_revision_number_positive" CHECK ("design_revision"."number" >= 1)
);
--> statement-breakpoint
ALTER TABLE "design" ADD CONSTRAINT "design_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design" ADD CONSTRAINT "design_vehicle_id_vehicle_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicle"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design" ADD CONSTRAINT "design_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_draft" ADD CONSTRAINT "design_draft_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_draft" ADD CONSTRAINT "design_draft_design_fk" FOREIGN KEY ("design_id","workspace_id") REFERENCES "public"."design"("id","workspace_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_revision" ADD CONSTRAINT "design_revision_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_revision" ADD CONSTRAINT "design_revision_design_fk" FOREIGN KEY ("design_id","workspace_id") REFERENCES "public"."design"("id","workspace_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "design_workspace_idx" ON "design" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "design_vehicle_idx" ON "design" USING btree ("vehicle_id");--> statement-breakpoint
CREATE INDEX "design_draft_workspace_idx" ON "design_draft" USING btree ("workspace_id");--> statement-breakpoint
CREATE UNIQUE INDEX "design_revision_number_idx" ON "design_revision" USING btree ("design_id","number");--> statement-breakpoint
CREATE INDEX "design_revision_workspace_idx" ON "design_revision" USING btree ("workspace_id");