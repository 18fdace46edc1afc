CREATE TABLE "vehicle_attention" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"vehicle_id" text NOT NULL,
	"reason" text NOT NULL,
	"bench_run_id" text,
	"step_number" integer,
	"raised_by" text,
	"raised_at" timestamp with time zone DEFAULT now() NOT NULL,
	"cleared_by" text,
	"cleared_at" timestamp with time zone,
	"clear_note" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "vehicle_release" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"vehicle_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"released_by" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"note" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "bench_run" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"vehicle_id" text NOT NULL,
	"revision_id" text NOT NULL,
	"revision_hash" text NOT NULL,
	"plan" jsonb NOT NULL,
	"status" text DEFAULT 'in-progress' NOT NULL,
	"started_by" text NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"completed_by" text,
	"completed_at" timestamp with time zone,
	"results_hash" text,
	CONSTRAINT "bench_run_status" CHECK ("bench_run"."status" in ('in-progress', 'completed')),
	CONSTRAINT "bench_run_completed_signed" CHECK (("bench_run"."status" = 'completed') = ("bench_run"."completed_at" is not null and "bench_run"."completed_by" is not null and "bench_run"."results_hash" is not null))
);
--> statement-breakpoint
CREATE TABLE "bench_step_result" (
	"id" text PRIMARY KEY NOT NULL,
	"workspace_id" text NOT NULL,
	"run_id" text NOT NULL,
	"n" integer NOT NULL,
	"outcome" text,
	"note" text DEFAULT '' NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone,
	CONSTRAINT "bench_step_result_outcome" CHECK ("bench_step_result"."outcome" is null or "bench_step_result"."outcome" in ('pass', 'fail', 'skip'))
);
--> statement-breakpoint
ALTER TABLE "vehicle_attention" ADD CONSTRAINT "vehicle_attention_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_attention" ADD CONSTRAINT "vehicle_attention_vehicle_id_vehicle_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicle"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_attention" ADD CONSTRAINT "vehicle_attention_raised_by_user_id_fk" FOREIGN KEY ("raised_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_attention" ADD CONSTRAINT "vehicle_attention_cleared_by_user_id_fk" FOREIGN KEY ("cleared_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_release" ADD CONSTRAINT "vehicle_release_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_release" ADD CONSTRAINT "vehicle_release_vehicle_id_vehicle_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicle"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_release" ADD CONSTRAINT "vehicle_release_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "vehicle_release" ADD CONSTRAINT "vehicle_release_released_by_user_id_fk" FOREIGN KEY ("released_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_run" ADD CONSTRAINT "bench_run_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_run" ADD CONSTRAINT "bench_run_vehicle_id_vehicle_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicle"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_run" ADD CONSTRAINT "bench_run_revision_id_design_revision_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."design_revision"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_run" ADD CONSTRAINT "bench_run_started_by_user_id_fk" FOREIGN KEY ("started_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_run" ADD CONSTRAINT "bench_run_completed_by_user_id_fk" FOREIGN KEY ("completed_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_step_result" ADD CONSTRAINT "bench_step_result_workspace_id_workspace_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspace"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_step_result" ADD CONSTRAINT "bench_step_result_run_id_bench_run_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."bench_run"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bench_step_result" ADD CONSTRAINT "bench_step_result_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "vehicle_attention_vehicle_idx" ON "vehicle_attention" USING btree ("workspace_id","vehicle_id");--> statement-breakpoint
CREATE INDEX "vehicle_release_vehicle_idx" ON "vehicle_release" USING btree ("workspace_id","vehicle_id","at");--> statement-breakpoint
CREATE INDEX "bench_run_workspace_idx" ON "bench_run" USING btree ("workspace_id","started_at");--> statement-breakpoint
CREATE INDEX "bench_run_vehicle_idx" ON "bench_run" USING btree ("workspace_id","vehicle_id");--> statement-breakpoint
CREATE UNIQUE INDEX "bench_step_result_run_n_idx" ON "bench_step_result" USING btree ("run_id","n");--> statement-breakpoint
CREATE INDEX "bench_step_result_workspace_idx" ON "bench_step_result" USING btree ("workspace_id");--> statement-breakpoint
-- The release history is append-only: a new release is a new row (docs/decisions/070).
CREATE FUNCTION vehicle_release_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'vehicle releases are history; release again instead' USING ERRCODE = 'restrict_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER vehicle_release_immutable BEFORE UPDATE ON vehicle_release
  FOR EACH ROW EXECUTE FUNCTION vehicle_release_refuse_update();
--> statement-breakpoint
-- A completed bench run is a signed record: neither it nor its step results change (docs/decisions/072).
CREATE FUNCTION bench_run_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF OLD.status = 'completed' THEN
    RAISE EXCEPTION 'bench run % is completed; its record cannot change', OLD.id USING ERRCODE = 'restrict_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER bench_run_signed BEFORE UPDATE ON bench_run
  FOR EACH ROW EXECUTE FUNCTION bench_run_refuse_update();
--> statement-breakpoint
CREATE FUNCTION bench_step_result_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM bench_run WHERE id = OLD.run_id AND status = 'completed') THEN
    RAISE EXCEPTION 'bench run % is completed; its results cannot change', OLD.run_id USING ERRCODE = 'restrict_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER bench_step_result_signed BEFORE UPDATE ON bench_step_result
  FOR EACH ROW EXECUTE FUNCTION bench_step_result_refuse_update();
