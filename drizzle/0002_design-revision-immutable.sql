-- Saved revisions are immutable: the database refuses any UPDATE of design_revision.
-- (Deleting a whole design still removes its revisions through the cascading key.)
CREATE FUNCTION design_revision_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'design revisions are immutable; save a new revision instead' USING ERRCODE = 'restrict_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER design_revision_immutable BEFORE UPDATE ON design_revision
  FOR EACH ROW EXECUTE FUNCTION design_revision_refuse_update();
