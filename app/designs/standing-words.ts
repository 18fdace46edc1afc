// The words of a revision that format 1.1 would refuse (decision 111), without the engine, for pages.

/** The one-line mark shown beside such a revision. */
export const REFUSED_MARK = "Refused by format 1.1";
