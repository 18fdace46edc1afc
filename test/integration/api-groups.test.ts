// Row groups and blocking reasons of a stored revision over the API: the spec's documents (checked
// against the engine's own row filters through the rows endpoint), 400 naming the field for a set or
// rule that cannot be used, members only, and both paths in the OpenAPI document.
import { beforeAll, describe, expect, it } from "vitest";
import { client, DEMO, signIn, type Client } from "../support/http";
import { createOutsider } from "../support/outsider";
import type { GroupsDocument, WhyDocument } from "../../app/engine";

const WS = "larkspur";
let reviewer: Client, outsider: Client;
let base: string;
let rules: Array<{ id: string; type: string; forbid?: unknown }>;
let contacts: string[];
let verdict: {
  rows: number;
  driveRows: number;
  rules: Array<{ id: string; unsafeRows?: number; violatingRows?: number }>;
  singleFaults: Array<{ component: string; mode: string }>;
};

beforeAll(async () => {
  reviewer = await signIn(DEMO.reviewer);
  outsider = (await createOutsider()).client;
  const list = (await (await reviewer.fetch(`/api/v1/designs?workspace=${WS}`)).json()) as {
    designs: Array<{ id: string; name: string; latestRevision: { number: number } | null }>;
  };
  const hauler = list.designs.find((d) => d.name.startsWith("Haybarn") && d.latestRevision)!;
  base = `/api/v1/designs/${hauler.id}/revisions/${hauler.latestRevision!.number}`;
  const rev = (await (await reviewer.fetch(base)).json()) as {
    revision: { document: { rules: typeof rules; components: Array<{ id: string; type: string }> }; verdict: typeof verdict };
  };
  rules = rev.revision.document.rules;
  contacts = rev.revision.document.components.filter((c) => c.type === "contact").map((c) => c.id);
  verdict = rev.revision.verdict;
});

/** The row indexes of a filter, read through the rows endpoint (the truth table's own filter). */
async function filteredRows(query: string): Promise<number> {
  const page = (await (await reviewer.fetch(`${base}/rows?${query}&count=1`)).json()) as { total: number };
  return page.total;
}

describe("GET …/groups", () => {
  it("answers chainproof/groups@1 whose sizes add up to the verdict's and the table's counts", async () => {
    const res = await reviewer.fetch(`${base}/groups?set=drive`);
    expect(res.status).toBe(200);
    const doc = (await res.json()) as GroupsDocument;
    expect(doc).toMatchObject({ format: "chainproof/groups@1", set: "drive", rows: verdict.driveRows });
    expect(doc.groups.reduce((n, g) => n + g.rows, 0)).toBe(doc.rows);
    expect(doc.groupCount).toBe(doc.groups.length);
    for (const r of rules.filter((x) => x.type === "inhibit")) {
      for (const kind of ["unsafe", "violating"] as const) {
        const g = (await (await reviewer.fetch(`${base}/groups?set=${kind}:${encodeURIComponent(r.id)}`)).json()) as GroupsDocument;
        expect(g.rows).toBe(await filteredRows(`only=${kind}&rule=${encodeURIComponent(r.id)}`));
        expect(g.groups.reduce((n, x) => n + x.rows, 0)).toBe(g.rows);
      }
    }
  });

  it("gives at most limit groups and says how many there are", async () => {
    const all = (await (await reviewer.fetch(`${base}/groups?set=unsafe:${encodeURIComponent(rules[0].id)}`)).json()) as GroupsDocument;
    const one = (await (
      await reviewer.fetch(`${base}/groups?set=unsafe:${encodeURIComponent(rules[0].id)}&limit=1`)
    ).json()) as GroupsDocument;
    expect(one.groupCount).toBe(all.groupCount);
    expect(one.groups).toEqual(all.groups.slice(0, 1));
  });

  it("answers 400 naming set for a set that cannot be grouped, and for a bad limit", async () => {
    const noRestart = rules.find((r) => r.type === "no-restart");
    const bad = [
      "drive-ish",
      "unsafe:no-such-rule",
      ...(noRestart ? [`violating:${noRestart.id}`] : []),
      "broken:no-such-contact/stuck-open",
      `broken:${contacts[0]}/stuck-sideways`,
    ];
    for (const set of bad) {
      const res = await reviewer.fetch(`${base}/groups?set=${encodeURIComponent(set)}`);
      expect(res.status, set).toBe(400);
      const body = (await res.json()) as { error: { code: string; fields: Array<{ path: string }> } };
      expect(body.error.fields.map((f) => f.path)).toEqual(["set"]);
    }
    for (const query of ["", "set=drive&limit=0", "set=drive&limit=x"]) {
      const res = await reviewer.fetch(`${base}/groups?${query}`);
      expect(res.status, query).toBe(400);
    }
  });

  it("is for members of the workspace only", async () => {
    expect((await outsider.fetch(`${base}/groups?set=drive`)).status).toBe(404);
    expect((await client().fetch(`${base}/groups?set=drive`)).status).toBe(401);
  });
});

describe("GET …/why", () => {
  it("splits each drive-forbidding inhibit rule's unsafe rows without drive by reason", async () => {
    for (const r of rules.filter((x) => x.type === "inhibit" && x.forbid === "drive")) {
      const res = await reviewer.fetch(`${base}/why?rule=${encodeURIComponent(r.id)}`);
      expect(res.status).toBe(200);
      const doc = (await res.json()) as WhyDocument;
      const v = verdict.rules.find((x) => x.id === r.id)!;
      expect(doc).toMatchObject({ format: "chainproof/why@1", rule: r.id, unsafeRows: v.unsafeRows });
      const explained = doc.reasons.reduce((n, p) => n + p.rows, 0);
      expect(explained + (v.violatingRows ?? 0)).toBe(v.unsafeRows);
      for (const p of doc.reasons) expect(p.groups.reduce((n, g) => n + g.rows, 0)).toBe(p.rows);
    }
  });

  it("answers 400 naming rule for an unknown rule or one that is not an inhibit rule forbidding drive", async () => {
    const other = rules.find((r) => r.type !== "inhibit" || r.forbid !== "drive");
    for (const rule of ["no-such-rule", ...(other ? [other.id] : [])]) {
      const res = await reviewer.fetch(`${base}/why?rule=${encodeURIComponent(rule)}`);
      expect(res.status, rule).toBe(400);
      const body = (await res.json()) as { error: { fields: Array<{ path: string }> } };
      expect(body.error.fields.map((f) => f.path)).toEqual(["rule"]);
    }
  });
});

describe("the OpenAPI document", () => {
  it("describes both paths", async () => {
    const doc = (await (await client().fetch("/api/v1/openapi.json")).json()) as { paths: Record<string, unknown> };
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining(["/api/v1/designs/{designId}/revisions/{number}/groups", "/api/v1/designs/{designId}/revisions/{number}/why"]),
    );
  });
});
