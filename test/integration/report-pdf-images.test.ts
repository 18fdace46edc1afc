// The printed report as paper: the PDF that Chromium prints for a small demo revision and for a
// 98,304-row one, read back with poppler's pdfinfo, pdftotext and pdftoppm (not code of ours): A4
// pages (595 × 842 pt, ISO 216), within the report's 24-page budget, no blank page, and the text a
// reader needs (wiring list, groups summary, verdict; for the large one the CSV's absolute URL).
// The wiring diagram is checked on paper from poppler's word boxes (pdftotext -bbox, in points) and
// its page image, not from the code that decides it (app/reviews/paper-diagram.ts, decision 166).
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, signIn, type Client } from "../support/http";
import { accessoryHauler } from "../support/accessory-hauler";
import { csvApiPath, reportPath } from "../../app/reviews/paths";
import { fiveParts } from "../support/five-parts";

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

const WS = "larkspur";
const PAGE_BUDGET = 24;
let engineer: Client;
let dir: string;

type Paper = { file: string; pages: number; sizes: string[]; text: string; ink: number[] };

/** One word as poppler places it: page (from 1) and box in points from the page's top left. */
type Word = { page: number; text: string; xMin: number; yMin: number; xMax: number; yMax: number };

/** Least legible print size: 6 pt (common practice, from memory; decision 165). */
const MIN_TYPE_PT = 6;
/** The report's @page margins (12 mm left and right, 14 mm top and bottom) in points: 1 mm = 72 / 25.4 pt. */
const MARGIN_X_PT = (12 * 72) / 25.4;
const MARGIN_Y_PT = (14 * 72) / 25.4;
/**
 * poppler's word box is the typeface's ascent to descent: its height is the type size times a factor of
 * the typeface. The factor is measured on the section heading, Tailwind's text-lg (18 CSS px = 13.5 pt;
 * 1 px = 0.75 pt, CSS 2.1; Tailwind's default scale, from memory), set in the drawing's typeface, and
 * checked on the note under the drawing, text-xs (12 px = 9 pt).
 */
const HEADING_PT = 13.5;
const NOTE_PT = 9;

const unescapeHtml = (s: string) =>
  s
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&amp;/g, "&");

/** Every word of the PDF with its box, from pdftotext -bbox (poppler). */
function wordsOf(file: string): { words: Word[]; pageSize: Array<{ w: number; h: number }> } {
  const html = execFileSync("pdftotext", ["-bbox", file, "-"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  const words: Word[] = [];
  const pageSize: Array<{ w: number; h: number }> = [];
  for (const page of html.split("<page ").slice(1)) {
    const size = /^width="([\d.]+)" height="([\d.]+)"/.exec(page)!;
    pageSize.push({ w: Number(size[1]), h: Number(size[2]) });
    for (const m of page.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)) {
      words.push({ page: pageSize.length, text: unescapeHtml(m[5]!), xMin: +m[1]!, yMin: +m[2]!, xMax: +m[3]!, yMax: +m[4]! });
    }
  }
  return { words, pageSize };
}

type Diagram = {
  page: number;
  pageSize: { w: number; h: number };
  words: Word[];
  ptPerHeight: number;
  claimedPt: number | null;
  /** The note's first word ("Smallest"), when the drawing prints. */
  note: Word | null;
};

/**
 * The words printed between the "Wiring diagram" heading and the next text of the section (the note
 * starting "Smallest type", or the left-out notice), on the heading's page; and the scale from poppler's
 * word-box height to type size, measured on the heading itself (same typeface as the drawing).
 */
function diagramOf(file: string): Diagram {
  const { words, pageSize } = wordsOf(file);
  const at = words.findIndex((w, i) => w.text === "Wiring" && words[i + 1]?.text === "diagram" && words[i + 1]!.page === w.page);
  expect(at).toBeGreaterThanOrEqual(0);
  const heading = words[at]!;
  const after = words.slice(at + 2).filter((w) => w.page === heading.page);
  const end = after.findIndex(
    (w, i) => (w.text === "Smallest" && after[i + 1]?.text === "type") || (w.text === "The" && after[i + 1]?.text === "diagram"),
  );
  expect(end).toBeGreaterThanOrEqual(0);
  const claimed = after[end]!.text === "Smallest" ? Number(after[end + 2]!.text) : null;
  return {
    page: heading.page,
    pageSize: pageSize[heading.page - 1]!,
    words: after.slice(0, end),
    ptPerHeight: HEADING_PT / (heading.yMax - heading.yMin),
    claimedPt: claimed,
    note: claimed === null ? null : after[end]!,
  };
}

/** A greyscale PGM's size and pixels (pdftoppm -gray). */
function pgm(file: string) {
  const buf = readFileSync(file);
  const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(buf.subarray(0, 64).toString("latin1"))!;
  return { w: Number(header[1]), h: Number(header[2]), px: buf.subarray(header[0].length) };
}

type Part = { id: string; type: string; label?: string; condition?: string; closedIn?: string[] };

/** What each part's box says on paper, line by line: its label (over 22 characters shortened with "…", as the note under the drawing says), "ID · kind", and a contact's states. */
function linesOf(parts: Part[]): string[] {
  const short = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
  return parts.flatMap((c) =>
    c.type === "junction"
      ? [c.id]
      : [
          short(c.label || c.id, 22),
          `${c.id} · ${c.type}`,
          ...(c.type === "contact" ? [short(`${c.condition}: closed in ${c.closedIn!.join(", ")}`, 30)] : []),
        ],
  );
}

/**
 * The diagram on paper, checked from poppler's output only: it is there exactly when the report's page
 * says so; every line of every part's box is printed whole on one line of the page (a cut label loses
 * its words past the cut); every word lies inside the page's printable box and is set at 6 pt or more;
 * and every word is inked at both ends of its box on the page image (a glyph cut at the drawing's edge
 * can keep its text in the PDF but loses its ink past the cut).
 */
async function checkDiagram(p: Paper, reportHtml: string, parts: Part[]): Promise<Diagram> {
  const dia = diagramOf(p.file);
  const says = reportHtml.includes('data-testid="report-diagram"');
  if (!says) {
    expect(dia.words).toEqual([]);
    expect(dia.claimedPt).toBeNull();
    expect(p.text).toContain("The diagram is left out");
    return dia;
  }
  expect(dia.claimedPt).not.toBeNull();
  expect(Math.abs((dia.note!.yMax - dia.note!.yMin) * dia.ptPerHeight - NOTE_PT)).toBeLessThan(0.1);
  // Lines of the page: words sharing a baseline band, left to right (two boxes side by side share a line).
  const byLine = new Map<number, Word[]>();
  for (const w of dia.words) {
    const key = [...byLine.keys()].find((y) => Math.abs(y - w.yMax) < 1) ?? w.yMax;
    byLine.set(key, [...(byLine.get(key) ?? []), w]);
  }
  const lines = [...byLine.values()].map((ws) =>
    ws
      .sort((a, b) => a.xMin - b.xMin)
      .map((w) => w.text)
      .join(" "),
  );
  for (const want of linesOf(parts))
    expect(
      lines.some((l) => l.includes(want)),
      `"${want}" printed whole on the diagram`,
    ).toBe(true);
  const { w: pageW, h: pageH } = dia.pageSize;
  const sizes = dia.words.map((w) => (w.yMax - w.yMin) * dia.ptPerHeight);
  for (const [i, w] of dia.words.entries()) {
    // pdftotext rounds to the PDF's units; half a point of slack at the margins.
    expect(w.xMin, w.text).toBeGreaterThanOrEqual(MARGIN_X_PT - 0.5);
    expect(w.xMax, w.text).toBeLessThanOrEqual(pageW - MARGIN_X_PT + 0.5);
    expect(w.yMin, w.text).toBeGreaterThanOrEqual(MARGIN_Y_PT - 0.5);
    expect(w.yMax, w.text).toBeLessThanOrEqual(pageH - MARGIN_Y_PT + 0.5);
    expect(sizes[i], w.text).toBeGreaterThanOrEqual(MIN_TYPE_PT);
  }
  // The note's figure is what is printed (rounded down to 0.1 pt).
  const smallest = Math.min(...sizes);
  expect(smallest - dia.claimedPt!).toBeGreaterThanOrEqual(-0.05);
  expect(smallest - dia.claimedPt!).toBeLessThan(0.2);
  // Ink under each word of two or more letters or digits: the first and the last fifth of its box carry dark pixels at 150 dpi.
  const dpi = 150;
  const base = join(dir, `diagram-${Date.now()}`);
  execFileSync("pdftoppm", ["-r", String(dpi), "-gray", "-f", String(dia.page), "-l", String(dia.page), "-singlefile", p.file, base]);
  const img = pgm(`${base}.pgm`);
  const k = dpi / 72;
  const inked = (x0: number, x1: number, y0: number, y1: number) => {
    for (let y = Math.floor(y0 * k); y < Math.ceil(y1 * k); y++)
      for (let x = Math.floor(x0 * k); x < Math.ceil(x1 * k); x++) if (img.px[y * img.w + x]! < 160) return true;
    return false;
  };
  for (const w of dia.words.filter((x) => /[A-Za-z0-9].*[A-Za-z0-9]/.test(x.text))) {
    const fifth = (w.xMax - w.xMin) / 5;
    expect(inked(w.xMin, w.xMin + fifth, w.yMin, w.yMax), `ink at the start of ${w.text}`).toBe(true);
    expect(inked(w.xMax - fifth, w.xMax, w.yMin, w.yMax), `ink at the end of ${w.text}`).toBe(true);
  }
  return dia;
}

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
  return { file, pages, sizes, text, ink: images.map((f) => inkOf(readFileSync(join(dir, f)))) };
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
  it("a demo revision prints on A4 pages with its diagram in one column, its wiring and its table", async () => {
    const list = (await (await engineer.fetch(`/api/v1/designs?workspace=${WS}`)).json()) as {
      designs: Array<{ id: string; name: string; latestRevision: { number: number } | null }>;
    };
    const demo = list.designs.find((d) => d.name.startsWith("Haybarn") && d.latestRevision)!;
    const p = await paper(`/w/${WS}/designs/${demo.id}/revisions/${demo.latestRevision!.number}/report.pdf`, "small");
    checkPaper(p);
    // Its 14 parts in one column fit one A4 page at 6.2 pt (decision 166): the report says it prints the diagram, and it is on paper.
    const html = await (await engineer.fetch(reportPath(WS, demo.id, demo.latestRevision!.number))).text();
    expect(html).toContain('data-testid="report-diagram"');
    const doc = (await (await engineer.fetch(`/api/v1/designs/${demo.id}/revisions/${demo.latestRevision!.number}`)).json()) as {
      revision: { document: { components: Part[] } };
    };
    await checkDiagram(p, html, doc.revision.document.components);
    // On US Letter (8.5 × 11 in: 18 mm shorter than A4) the same column would print under 6 pt: the
    // report says it leaves the drawing out, and paper agrees.
    const letter = await paper(`/w/${WS}/designs/${demo.id}/revisions/${demo.latestRevision!.number}/report.pdf?size=letter`, "letter");
    for (const s of letter.sizes) expect(s).toBe("612 x 792");
    const letterHtml = await (await engineer.fetch(reportPath(WS, demo.id, demo.latestRevision!.number, "letter"))).text();
    expect(letterHtml).not.toContain('data-testid="report-diagram"');
    await checkDiagram(letter, letterHtml, doc.revision.document.components);
    // The wiring list names terminals ("SUPPLY.+"-style component.terminal ids).
    expect(p.text).toMatch(/From terminal\s+To terminal\s+Net/i);
    expect(p.text).toMatch(/[A-Z][A-Z0-9_]*\.[A-Za-z0-9+-]+\s+[A-Z][A-Z0-9_]*\.[A-Za-z0-9+-]+\s+N\d+/);
    expect(p.text).toMatch(/Truth table/);
    expect(p.text).not.toContain("The full table is not printed");
  }, 120_000);

  it("a five-part design prints its diagram on paper, every label whole, inside the printable box and at 6 pt or more", async () => {
    const made = await engineer.fetch(`/api/v1/designs?workspace=${WS}`, {
      method: "POST",
      body: JSON.stringify({ name: `Five parts print ${Date.now()}`, start: "blank" }),
      headers: { "content-type": "application/json" },
    });
    expect(made.status).toBe(201);
    const id = ((await made.json()) as { design: { id: string } }).design.id;
    const saved = await engineer.fetch(`/api/v1/designs/${id}/revisions`, {
      method: "POST",
      body: JSON.stringify({ document: fiveParts(), baseRevision: 0, message: "two contacts" }),
      headers: { "content-type": "application/json" },
    });
    expect(saved.status).toBe(201);
    const p = await paper(`/w/${WS}/designs/${id}/revisions/1/report.pdf`, "five");
    checkPaper(p);
    const html = await (await engineer.fetch(reportPath(WS, id, 1))).text();
    // Three columns on the canvas fit A4's width: the report says it prints the drawing, and it is on paper.
    expect(html).toContain('data-testid="report-diagram"');
    await checkDiagram(p, html, fiveParts().components);
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
    // Its 23 parts fit one page neither wide nor in one column at 6 pt: the report leaves the drawing out
    // and prints the wiring list, every wire of it.
    const html = await (await engineer.fetch(reportPath(WS, id, 1))).text();
    expect(html).not.toContain('data-testid="report-diagram"');
    const dia = await checkDiagram(p, html, []);
    expect(dia.words).toEqual([]);
    const wires = accessoryHauler().wires;
    for (const w of wires) expect(p.text).toMatch(new RegExp(`${escape(w.from)}\\s+${escape(w.to)}\\s+N\\d+`));
  }, 240_000);
});
