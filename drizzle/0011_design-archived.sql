ALTER TABLE "design" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "design" ADD COLUMN "archived_by" text;--> statement-breakpoint
ALTER TABLE "design" ADD CONSTRAINT "design_archived_by_user_id_fk" FOREIGN KEY ("archived_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design" ADD CONSTRAINT "design_archived_with_whom" CHECK (("design"."archived_at" is null) = ("design"."archived_by" is null));