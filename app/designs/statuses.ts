// Where a design stands, in a module of its own: the API's answer schemas and the design pages
// both need it, and neither should import the other for it.

/**
 * "draft": no revision saved yet; "proven": the latest revision is saved
 * (only proven designs save, so every revision is proven). Review states come with reviews.
 */
export const DESIGN_STATUSES = ["draft", "proven"] as const;
export type DesignStatus = (typeof DESIGN_STATUSES)[number];
