CREATE TYPE "public"."review_comment_anchor" AS ENUM('revision', 'row', 'component');--> statement-breakpoint
CREATE TYPE "public"."review_verdict" AS ENUM('approved', 'changes-requested');--> statement-breakpoint
CREATE TABLE "review_comment" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"author_id" text NOT NULL,
	"anchor" "review_comment_anchor" DEFAULT 'revision' NOT NULL,
	"row_index" integer,
	"row_states" jsonb,
	"component_id" text,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "review_comment_anchor_fields" CHECK (("review_comment"."anchor" = 'row' AND "review_comment"."row_index" IS NOT NULL AND "review_comment"."row_index" >= 0 AND "review_comment"."row_states" IS NOT NULL)
        OR ("review_comment"."anchor" = 'component' AND "review_comment"."component_id" IS NOT NULL)
        OR ("review_comment"."anchor" = 'revision'))
);
--> statement-breakpoint
CREATE TABLE "review_decision" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"design_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"reviewer_id" text NOT NULL,
	"verdict" "review_verdict" NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"content_hash" text NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "review_request" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"design_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"reviewer_id" text NOT NULL,
	"requested_by" text NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comment" ADD CONSTRAINT "review_comment_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_design_id_design_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."design"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_decision" ADD CONSTRAINT "review_decision_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_request" ADD CONSTRAINT "review_request_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_request" ADD CONSTRAINT "review_request_design_id_design_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."design"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_request" ADD CONSTRAINT "review_request_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_request" ADD CONSTRAINT "review_request_reviewer_id_user_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_request" ADD CONSTRAINT "review_request_requested_by_user_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "review_comment_revision_idx" ON "review_comment" USING btree ("revision_id","created_at");--> statement-breakpoint
CREATE INDEX "review_comment_workspace_idx" ON "review_comment" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "review_decision_revision_idx" ON "review_decision" USING btree ("revision_id","decided_at");--> statement-breakpoint
CREATE INDEX "review_decision_workspace_idx" ON "review_decision" USING btree ("workspace_id");--> statement-breakpoint
CREATE UNIQUE INDEX "review_request_revision_reviewer_idx" ON "review_request" USING btree ("revision_id","reviewer_id");--> statement-breakpoint
CREATE INDEX "review_request_workspace_idx" ON "review_request" USING btree ("workspace_id");--> statement-breakpoint
CREATE INDEX "review_request_reviewer_idx" ON "review_request" USING btree ("reviewer_id");--> statement-breakpoint
-- A decision is a signature: the database refuses to change one (a reviewer decides again instead).
CREATE FUNCTION review_decision_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'review decisions are immutable; record a new decision instead' USING ERRCODE = 'restrict_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER review_decision_immutable BEFORE UPDATE ON review_decision
  FOR EACH ROW EXECUTE FUNCTION review_decision_refuse_update();
