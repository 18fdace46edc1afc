// A saved revision's document, read back as the engine's Design. Every reader of a stored revision
// goes through here rather than casting the jsonb or validating it again in its own words.
// Revisions are written proven (saveProvenRevision in designs.server.ts), so a document that no
// longer validates was damaged in storage: a fault of the server, named by revision, never the user's.
// A rule matching no row is not damage: revisions saved before format 1.1 may hold one; they stay
// readable and are marked (validateStoredDesign; decision 111).
import { validateStoredDesign, type Design } from "~/engine";

export class DamagedRevisionError extends Error {
  constructor(
    public readonly revision: string,
    detail: string,
  ) {
    super(`revision ${revision} holds a document the engine no longer accepts: ${detail}`);
    this.name = "DamagedRevisionError";
  }
}

/** The stored document of a revision (`revision` names it in the error) as a validated Design. */
export function readRevisionDesign(stored: unknown, revision: string): Design {
  const valid = validateStoredDesign(stored);
  if (!valid.ok) {
    const first = valid.problems[0];
    throw new DamagedRevisionError(revision, first ? `${first.path}: ${first.message}` : "unknown problem");
  }
  return valid.design;
}
