CREATE TABLE "controller_record" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"vehicle_id" text NOT NULL,
	"version" integer NOT NULL,
	"document" jsonb NOT NULL,
	"recorded_by" text NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "controller_record_version_positive" CHECK ("controller_record"."version" >= 1)
);
--> statement-breakpoint
ALTER TABLE "controller_record" ADD CONSTRAINT "controller_record_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "controller_record" ADD CONSTRAINT "controller_record_vehicle_id_vehicle_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicle"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "controller_record" ADD CONSTRAINT "controller_record_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "controller_record_version_idx" ON "controller_record" USING btree ("vehicle_id","version");--> statement-breakpoint
CREATE INDEX "controller_record_workspace_idx" ON "controller_record" USING btree ("workspace_id","vehicle_id");--> statement-breakpoint
-- A version of a controller settings record is history: a change is a new version, never an update.
CREATE FUNCTION controller_record_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'controller settings records are versioned; save a new version instead' USING ERRCODE = 'restrict_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER controller_record_immutable BEFORE UPDATE ON controller_record
  FOR EACH ROW EXECUTE FUNCTION controller_record_refuse_update();
