// Design events in words: every design action reads as a sentence that starts with who did it,
// names the revision or vehicle, links the page to read more, and shows no action code, id or
// address; events that are not about designs are not described.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
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
      detail: {
        designId: D,
        number: 3,
        fault: "SEAT_SW/stuck-closed",
        disposition: "fix-next-revision",
        justification: "Sealed switch in r4;\n  the seat is checked at every shift until then.",
      },
    },
    text: "Rhea recorded how SEAT_SW stuck closed in “Haybarn hauler revision 3” is dealt with: to be fixed in the next revision. Justification: “Sealed switch in r4; the seat is checked at every shift until then.”",
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

  it("quotes a long justification shortened at a word, on one line, ending in an ellipsis", () => {
    // 17 words of 12 characters each (a space between): 220 characters, over the 120 an activity line quotes.
    const words = Array.from({ length: 17 }, (_, i) => `word${String(i).padStart(2, "0")}abcdef`);
    const e = {
      action: "review.fault-disposed",
      subject: "Cart revision 2",
      detail: { designId: D, number: 2, fault: "KEY/stuck-open", disposition: "accepted", justification: words.join("\n") },
      actorName: "Rhea",
    };
    // Nine words and their eight spaces are 116 characters; a tenth would pass 119 before the ellipsis.
    expect(describeDesignEvent(e, "ws")!.text).toBe(
      `Rhea recorded how KEY stuck open in “Cart revision 2” is dealt with: accepted. Justification: “${words.slice(0, 9).join(" ")}…”`,
    );
  });

  it("never quotes more than 120 characters of a justification, and what it quotes is the justification's start", () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom("a", "b", " ", "\n", ",", "é"), minLength: 10, maxLength: 400 }), (justification) => {
        const text = describeDesignEvent(
          {
            action: "review.fault-disposed",
            subject: "Cart revision 2",
            detail: { designId: D, number: 2, fault: "KEY/stuck-open", disposition: "ruled-out", justification },
            actorName: "Rhea",
          },
          "ws",
        )!.text;
        const flat = justification.replace(/\s+/g, " ").trim();
        const quoted = /Justification: “(.*)”$/s.exec(text)?.[1];
        if (flat === "") return expect(text).toMatch(/ruled out for this part\.$/);
        expect(quoted).toBeDefined();
        expect(quoted!.length).toBeLessThanOrEqual(120);
        expect(quoted).not.toMatch(/\n/);
        if (flat.length <= 120) expect(quoted).toBe(flat);
        else {
          expect(quoted!.endsWith("…")).toBe(true);
          expect(flat.startsWith(quoted!.slice(0, -1))).toBe(true);
        }
      }),
    );
  });

  it("describes nothing that is not about designs", () => {
    for (const action of ["sign-in", "sign-in.failed", "member.invited", "api-key.created", "bench-run.completed", "upload.created"]) {
      expect(describeDesignEvent({ action, subject: "x", detail: {}, actorName: "Rhea" }, "ws")).toBeNull();
    }
  });
});
