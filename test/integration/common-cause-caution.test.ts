// @vitest-environment jsdom
// Wherever single-fault results appear, the full common-cause caution is beside them: causes acting on
// several contacts are not covered, the source is named with its edition and said to be superseded, and
// the result is no category or performance-level claim. Source: ISO 13849-1:2006, 7.2 and Annex F,
// superseded by the 2015 and 2023 editions (shared/spec/check-values.md). Read from the server-rendered
// pages with the browser's DOM (jsdom), not from the component that writes the note: every text that
// reports a single fault lies in a block marked as single-fault results, and every such block carries
// the caution in full.
import { beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { DEMO, signIn, type Client } from "../support/http";
import type { Design } from "../../app/engine";

const WS = "larkspur";
// The DOM's URL is jsdom's here: the file is named by path.
const HAYBARN = JSON.parse(
  readFileSync(join(import.meta.dirname, "../../drizzle/demo-designs/haybarn-campus-hauler.json"), "utf8"),
) as Design;

/** What a single-fault result says: a contact stuck open or closed, or a count of faults that defeat rules. */
const RESULT = /stuck[ -](open|closed)|single faults? defeats?/i;

let engineer: Client;
let designId: string;

function cautionOf(text: string) {
  const t = text.replace(/\s+/g, " ");
  return {
    commonCause: /common-cause failures/.test(t),
    edition: t.includes("ISO 13849-1:2006"),
    superseded: /superseded/.test(t),
    noClaim: t.includes("not a category or performance-level claim"),
  };
}
const FULL = { commonCause: true, edition: true, superseded: true, noClaim: true };

/** The page's single-fault blocks and the texts that report a single fault outside any of them. */
async function readPage(path: string) {
  const res = await engineer.fetch(path);
  expect(res.status, path).toBe(200);
  const doc = new DOMParser().parseFromString(await res.text(), "text/html");
  // Scripts carry the loader's data as JSON (and the note's text once more); only what is shown counts.
  for (const s of doc.querySelectorAll("script, style, template")) s.remove();
  const blocks = [...doc.querySelectorAll("[data-single-faults]")];
  const outside: string[] = [];
  const walker = doc.createTreeWalker(doc.body, NodeFilter.SHOW_ELEMENT);
  for (let n = walker.nextNode() as Element | null; n; n = walker.nextNode() as Element | null) {
    // The innermost elements whose own text reports a fault.
    const own = [...n.childNodes]
      .filter((c) => c.nodeType === 3)
      .map((c) => c.textContent)
      .join("");
    const text = n.children.length === 0 ? (n.textContent ?? "") : own;
    if (RESULT.test(text) && !n.closest("[data-single-faults]")) outside.push(n.textContent!.trim().slice(0, 120));
  }
  return { blocks, outside };
}

beforeAll(async () => {
  engineer = await signIn(DEMO.engineer);
  const made = await engineer.fetch(`/api/v1/designs?workspace=${WS}`, {
    method: "POST",
    body: JSON.stringify({ name: `Caution check ${Date.now()}`, start: "blank" }),
    headers: { "content-type": "application/json" },
  });
  expect(made.status).toBe(201);
  designId = ((await made.json()) as { design: { id: string } }).design.id;
  // Revision 1: the Haybarn wiring, whose stuck contacts defeat seven rules; revision 2 drops the
  // key-off rule, so a single fault goes away between them and the comparison reports it.
  const second = { ...HAYBARN, rules: HAYBARN.rules.filter((r) => r.id !== "key-off") };
  for (const [i, document] of [HAYBARN, second].entries()) {
    const saved = await engineer.fetch(`/api/v1/designs/${designId}/revisions`, {
      method: "POST",
      body: JSON.stringify({ document, baseRevision: i, message: `revision ${i + 1}` }),
      headers: { "content-type": "application/json" },
    });
    expect(saved.status).toBe(201);
  }
});

describe("the common-cause caution beside every single-fault result", () => {
  const pages: Array<[string, () => string, number]> = [
    // [page, path, blocks of single-fault results it shows]
    ["designs list", () => `/w/${WS}/designs`, 1],
    ["design page", () => `/w/${WS}/designs/${designId}`, 1],
    // Review: the faults with their dispositions, the verdict, and the verdict's changes (a fault gone).
    ["review page", () => `/w/${WS}/designs/${designId}/revisions/2/review`, 3],
    // Report: the results under the rules, the faults with their dispositions, the verdict's changes.
    ["report", () => `/w/${WS}/designs/${designId}/revisions/2/report`, 3],
    ["report on Letter, compared with revision 1", () => `/w/${WS}/designs/${designId}/revisions/2/report?size=letter&compare=1`, 3],
  ];
  for (const [name, path, count] of pages) {
    it(`${name}: each single-fault result sits in a block that carries the full caution`, async () => {
      const { blocks, outside } = await readPage(path());
      expect(outside, "single-fault results outside a block with the caution").toEqual([]);
      expect(blocks).toHaveLength(count);
      for (const b of blocks) {
        expect(RESULT.test(b.textContent ?? "") || /No single stuck contact/.test(b.textContent ?? "")).toBe(true);
        expect(cautionOf(b.textContent ?? "")).toEqual(FULL);
      }
    });
  }

  it("without a single fault coming or going, the changes carry no block of their own", async () => {
    // The first revision has nothing to compare with: the faults and the verdict only.
    const first = await readPage(`/w/${WS}/designs/${designId}/revisions/1/review`);
    expect(first.outside).toEqual([]);
    expect(first.blocks).toHaveLength(2);
  });
});
