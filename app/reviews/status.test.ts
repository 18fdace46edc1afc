// Review status from requests and decisions (docs/decisions/060).
import { describe, expect, it } from "vitest";
import { reviewStatus } from "./status";

const at = (m: number) => new Date(Date.UTC(2026, 10, 30, 12, m));
const d = (reviewerId: string, verdict: "approved" | "changes-requested", m: number, contentHash = "h1") => ({
  reviewerId,
  verdict,
  decidedAt: at(m),
  contentHash,
});

describe("reviewStatus", () => {
  it("is not-requested without requests or decisions, in-review with a request only", () => {
    expect(reviewStatus("h1", 0, [])).toBe("not-requested");
    expect(reviewStatus("h1", 2, [])).toBe("in-review");
  });
  it("counts each reviewer's latest decision: a later approval replaces their own request for changes", () => {
    expect(reviewStatus("h1", 1, [d("a", "changes-requested", 1)])).toBe("changes-requested");
    expect(reviewStatus("h1", 1, [d("a", "changes-requested", 1), d("a", "approved", 2)])).toBe("approved");
    expect(reviewStatus("h1", 1, [d("a", "approved", 1), d("a", "changes-requested", 2)])).toBe("changes-requested");
  });
  it("lets any reviewer's outstanding request for changes win over another's approval", () => {
    expect(reviewStatus("h1", 2, [d("a", "approved", 1), d("b", "changes-requested", 2)])).toBe("changes-requested");
    expect(reviewStatus("h1", 2, [d("b", "changes-requested", 1), d("a", "approved", 2)])).toBe("changes-requested");
  });
  it("ignores a decision that signed another content hash", () => {
    expect(reviewStatus("h2", 1, [d("a", "approved", 1, "h1")])).toBe("in-review");
  });
});
