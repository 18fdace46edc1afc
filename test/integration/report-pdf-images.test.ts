// The printed report as paper: the PDF that Chromium prints for a small demo revision and for a
// 98,304-row one, read back with poppler's pdfinfo, pdftotext and pdftoppm (not code of ours): A4
// pages (595 × 842 pt, ISO 216), within the report's 24-page budget, no blank page, and the text a
// reader needs (wiring list, groups summary, verdict; for the large one the CSV's absolute URL).
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, signIn, type Client } from "../support/http";
import { accessoryHauler } from "../support/accessory-hauler";
import { csvApiPath } from "../../app/reviews/paths";

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

const WS = "larkspur";
const PAGE_BUDGET = 24;
let engineer: Client;
let dir: string;

type Paper = { pages: number; sizes: string[]; text: string; ink: number[] };

/** Ink per page: the share of pixels darker than near-white in pdftoppm's 8-bit greyscale (PGM, P5) images. */
function inkOf(pgm: Buffer): number {
  // Header: "P5", width, height, maxval, each separated by whitespace, then one byte per pixel.
  const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(pgm.subarray(0, 64).toString("latin1"));
  if (!header) throw new Error("not a binary PGM");
  const [w, h] = [Number(header[1]), Number(header[2])];
  const pixels = pgm.subarray(header[0].length, header[0].length + w * h);
  let dark = 0;
  for (const p of pixels) if (p < 200) dark++;
  return dark / (w * h);
}

async function paper(path: string, name: string): Promise<Paper> {
  const res = await engineer.fetch(path);
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toBe("application/pdf");
  const file = join(dir, `${name}.pdf`);
  writeFileSync(file, Buffer.from(await res.arrayBuffer()));
  const info = execFileSync("pdfinfo", ["-l", "999", file], { encoding: "utf8" });
  const pages = Number(/^Pages:\s+(\d+)/m.exec(info)?.[1]);
  const sizes = [...info.matchAll(/^Page\s+\d+ size:\s+([\d.]+ x [\d.]+) pts/gm)].map((m) => m[1]!);
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  execFileSync("pdftoppm", ["-r", "30", "-gray", file, join(dir, name)]);
  const images = readdirSync(dir)
    .filter((f) => f.startsWith(`${name}-`) && f.endsWith(".pgm"))
    .sort();
  return { pages, sizes, text, ink: images.map((f) => inkOf(readFileSync(join(dir, f)))) };
}

function checkPaper(p: Paper) {
  expect(p.pages).toBeGreaterThan(1);
  expect(p.pages).toBeLessThanOrEqual(PAGE_BUDGET);
  // A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216); pdfinfo rounds.
  expect(p.sizes).toHaveLength(p.pages);
  for (const s of p.sizes) {
    const [w, h] = s.split(" x ").map(Number) as [number, number];
    expect(Math.abs(w - 595.28)).toBeLessThan(1);
    expect(Math.abs(h - 841.89)).toBeLessThan(1);
  }
  // Every page carries print: at 30 dpi these pages darken 2-18% of their pixels; a blank or near-blank one (a stray heading) under 0.5%.
  expect(p.ink).toHaveLength(p.pages);
  for (const share of p.ink) expect(share).toBeGreaterThan(0.005);
  expect(p.text).toContain("Wiring list");
  expect(p.text).toContain("What the table says, in groups");
  expect(p.text).toContain("Rules with their reasons");
  expect(p.text).toMatch(/Verdict\s+(Every rule holds|Some rules fail)/);
  expect(p.text).toContain("Caution.");
}

beforeAll(async () => {
  engineer = await signIn(DEMO.engineer);
  dir = mkdtempSync(join(tmpdir(), "chainproof-report-pdf-"));
});
afterAll(() => {
  if (!process.env.KEEP_REPORT_PDF) rmSync(dir, { recursive: true, force: true });
});

describe("the printed report, rendered to images", () => {
  it("a small demo revision prints on A4 pages with its wiring and its table", async () => {
    const list = (await (await engineer.fetch(`/api/v1/designs?workspace=${WS}`)).json()) as {
      designs: Array<{ id: string; name: string; latestRevision: { number: number } | null }>;
    };
    const demo = list.designs.find((d) => d.name.startsWith("Haybarn") && d.latestRevision)!;
    const p = await paper(`/w/${WS}/designs/${demo.id}/revisions/${demo.latestRevision!.number}/report.pdf`, "small");
    checkPaper(p);
    // The wiring list names terminals ("SUPPLY.+"-style component.terminal ids) and the diagram either
    // prints or says it is left out for the list.
    expect(p.text).toMatch(/From terminal\s+To terminal\s+Net/i);
    expect(p.text).toMatch(/[A-Z][A-Z0-9_]*\.[A-Za-z0-9+-]+\s+[A-Z][A-Z0-9_]*\.[A-Za-z0-9+-]+\s+N\d+/);
    expect(p.text).toMatch(/Wiring diagram\s+(The diagram is left out|[\s\S]*Labels longer than 22 characters)/);
    expect(p.text).toMatch(/Truth table/);
    expect(p.text).not.toContain("The full table is not printed");
  }, 120_000);

  it("a 98,304-row revision prints the summary and the CSV's absolute URL, not the table", async () => {
    const made = await engineer.fetch(`/api/v1/designs?workspace=${WS}`, {
      method: "POST",
      body: JSON.stringify({ name: `Accessory hauler print ${Date.now()}`, start: "blank" }),
      headers: { "content-type": "application/json" },
    });
    expect(made.status).toBe(201);
    const id = ((await made.json()) as { design: { id: string } }).design.id;
    const saved = await engineer.fetch(`/api/v1/designs/${id}/revisions`, {
      method: "POST",
      body: JSON.stringify({ document: accessoryHauler(), baseRevision: 0, message: "accessories on the enable line" }),
      headers: { "content-type": "application/json" },
    });
    expect(saved.status).toBe(201);
    const p = await paper(`/w/${WS}/designs/${id}/revisions/1/report.pdf`, "large");
    checkPaper(p);
    expect(p.text).toContain("98,304 rows");
    expect(p.text).toContain("The full table is not printed");
    // pdftotext may break the long URL across lines: compare without whitespace.
    // The URL is absolute (scheme and host), on the app's own CSV path for this revision.
    expect(p.text.replace(/\s+/g, "")).toMatch(new RegExp(`https?://[^/]+${escape(csvApiPath(id, 1))}`));
    // This drawing is far wider than the page: the report leaves it out for the wiring list.
    expect(p.text).toContain("The diagram is left out");
  }, 240_000);
});
