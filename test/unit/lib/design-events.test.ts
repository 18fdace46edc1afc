// Design events in words: every design action reads as a sentence that starts with who did it,
// names the revision or vehicle, links the page to read more, and shows no action code, id or
// address; events that are not about designs are not described.
import { describe, expect, it } from "vitest";
import { DESIGN_EVENT_ACTIONS, describeDesignEvent, type DesignEvent } from "../../../app/audit/design-events";

const D = "4f1c2a9e-0000-4000-8000-00000000d351";
const V = "4f1c2a9e-0000-4000-8000-00000000a001";
const examples: Record<(typeof DESIGN_EVENT_ACTIONS)[number], { e: Omit<DesignEvent, "actorName">; text: string; href: string | null }> = {
  "design.created": {
    e: { action: "design.created", subject: "Haybarn hauler", detail: { designId: D, start: "blank" } },
    text: "Rhea created the design “Haybarn hauler”.",
    href: `/w/ws/designs/${D}`,
  },
  "design.revision-saved": {
    e: { action: "design.revision-saved", subject: "Haybarn hauler", detail: { designId: D, number: 3, contentHash: "ab".repeat(32) } },
    text: "Rhea saved revision 3 of “Haybarn hauler”.",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "design.archived": {
    e: { action: "design.archived", subject: "Haybarn hauler", detail: { designId: D } },
    text: "Rhea archived the design “Haybarn hauler”; its revisions stay readable.",
    href: `/w/ws/designs/${D}`,
  },
  "design.unarchived": {
    e: {
      action: "design.unarchived",
      subject: "Haybarn hauler",
      detail: { designId: D, archivedAt: "2026-11-30T09:00:00.000Z", archivedBy: "4f1c2a9e-0000-4000-8000-00000000u001" },
    },
    text: "Rhea brought back the design “Haybarn hauler” from the archive.",
    href: `/w/ws/designs/${D}`,
  },
  "review.requested": {
    e: {
      action: "review.requested",
      subject: "Haybarn hauler revision 3",
      detail: { designId: D, number: 3, reviewers: ["a@example.test", "b@example.test"] },
    },
    text: "Rhea asked 2 reviewers to review “Haybarn hauler revision 3”.",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "review.commented": {
    e: {
      action: "review.commented",
      subject: "Haybarn hauler revision 3",
      detail: { designId: D, anchor: "row", row: 12, component: null },
    },
    text: "Rhea commented on “Haybarn hauler revision 3” (on truth-table row 12).",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "review.approved": {
    e: { action: "review.approved", subject: "Haybarn hauler revision 3", detail: { designId: D, number: 3 } },
    text: "Rhea approved “Haybarn hauler revision 3”.",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "review.changes-requested": {
    e: { action: "review.changes-requested", subject: "Haybarn hauler revision 3", detail: { designId: D, number: 3 } },
    text: "Rhea asked for changes to “Haybarn hauler revision 3”.",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "review.fault-disposed": {
    e: {
      action: "review.fault-disposed",
      subject: "Haybarn hauler revision 3",
      detail: { designId: D, number: 3, fault: "SEAT_SW/stuck-closed", disposition: "fix-next-revision", justification: "x" },
    },
    text: "Rhea recorded how SEAT_SW stuck closed in “Haybarn hauler revision 3” is dealt with: to be fixed in the next revision.",
    href: `/w/ws/designs/${D}/revisions/3/review`,
  },
  "vehicle.revision-released": {
    e: { action: "vehicle.revision-released", subject: "Cart 7", detail: { vehicleId: V, number: 3, design: "Haybarn hauler" } },
    text: "Rhea put “Haybarn hauler” revision 3 on the vehicle “Cart 7”.",
    href: `/w/ws/vehicles/${V}`,
  },
};

describe("design events in words", () => {
  for (const action of DESIGN_EVENT_ACTIONS) {
    it(`describes ${action} as a sentence without codes`, () => {
      const { e, text, href } = examples[action];
      const words = describeDesignEvent({ ...e, actorName: "Rhea" }, "ws")!;
      expect(words.text).toBe(text);
      expect(words.href).toBe(href);
      expect(words.text).not.toContain(action);
      expect(words.text).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}|@|\{|undefined|null/);
    });
  }

  it("still reads when details are missing, and says someone when the actor is gone", () => {
    for (const action of DESIGN_EVENT_ACTIONS) {
      const words = describeDesignEvent({ action, subject: null, detail: null, actorName: null }, "ws")!;
      expect(words.text).toMatch(/^Someone [a-z]/);
      expect(words.text).not.toMatch(/undefined|null|\{|\?| \.|“”/);
      expect(words.href).toBeNull();
    }
  });

  it("describes nothing that is not about designs", () => {
    for (const action of ["sign-in", "sign-in.failed", "member.invited", "api-key.created", "bench-run.completed", "upload.created"]) {
      expect(describeDesignEvent({ action, subject: "x", detail: {}, actorName: "Rhea" }, "ws")).toBeNull();
    }
  });
});
