// The printed truth table in bands: paper is narrower than a screen, and a table wider than the
// page would lose its right-hand columns (the drive, the rules) without a word. Every band repeats
// the row number and the conditions, then carries as many of the other columns as fit, most
// important first: the drive, the rules, the contacts, the inputs, the controller's view.
import type { TableColumns } from "./truth-table";

/** Which columns beside the row number and the conditions one band shows (indices into columns). */
export type Band = { drive: boolean; rules: number[]; contacts: number[]; inputs: number[]; controller: boolean };

/** Everything in one band: the screen's table. */
export const wholeTable = (columns: TableColumns): Band => ({
  drive: true,
  rules: columns.rules.map((_, i) => i),
  contacts: columns.contacts.map((_, i) => i),
  inputs: columns.inputs.map((_, i) => i),
  controller: true,
});

// The printed table's type: 9 px monospace (5.4 px a character, 0.6 em) with 4 px of padding on
// each side of a cell (TruthTableGrid's `dense`). Widths below are in characters of that type.
export const PRINT_CHAR_PX = 5.4;
const PADDING = 8 / PRINT_CHAR_PX;
const cell = (chars: number) => chars + PADDING;
const CELL_TEXT = { contact: "━ closed".length, input: "● live".length, drive: "▶DRIVE".length + 1, rule: "✕violating".length + 1 };
const CONTROLLER = ["powered", "enabled", "direction", "braking", "throttle"].map((h) => cell(Math.max(h.length, "conflict".length)));

/**
 * 186 mm of A4 between 12 mm margins at 96 px/in, in characters: 130. Letter is wider, so A4
 * decides.
 */
export const PAGE_CHARS = Math.floor(((186 / 25.4) * 96) / PRINT_CHAR_PX);

/**
 * Rows of the printed table that one page holds, by paper, for the estimate that decides whether the
 * report prints the whole table. Measured on Chromium's PDF (poppler's pdftotext): a full A4 page
 * carries 86-87 rows under the repeated heading row, a Letter page 80-81 (its printable height is
 * 251.4 mm against A4's 269 mm between 14 mm margins). The figures keep about 7% in hand: 80 on A4,
 * and 80 × 251.4 ÷ 269, rounded down, on Letter.
 */
export const PRINT_ROWS_PER_PAGE = { a4: 80, letter: 74 } as const;
/** Rows' worth of paper above a band's first row: the section's heading and sentences above the first band (which starts a page), a part's heading above the others. */
export const FIRST_BAND_HEAD_ROWS = 16;
export const PART_HEAD_ROWS = 5;

/** Pages the whole printed table takes at most on the paper: every band starts a page and runs over whole pages of rows. */
export function printedTablePages(columns: TableColumns, totalRows: number, size: keyof typeof PRINT_ROWS_PER_PAGE): number {
  const perPage = PRINT_ROWS_PER_PAGE[size];
  return printBands(columns, totalRows).reduce(
    (pages, _, i) => pages + Math.ceil((totalRows + (i === 0 ? FIRST_BAND_HEAD_ROWS : PART_HEAD_ROWS)) / perPage),
    0,
  );
}

type Piece = { width: number; add: (b: Band) => void };

export function printBands(columns: TableColumns, totalRows: number, pageChars = PAGE_CHARS): Band[] {
  const keyWidth =
    cell(Math.max("Row".length, String(Math.max(0, totalRows - 1)).length)) +
    columns.conditions.reduce((w, c) => w + cell(Math.max(c.id.length, ...c.states.map((s) => s.length))), 0);
  const pieces: Piece[] = [
    { width: cell(Math.max("Drive".length, CELL_TEXT.drive)), add: (b) => (b.drive = true) },
    ...columns.rules.map((r, i) => ({ width: cell(Math.max(r.id.length, CELL_TEXT.rule)), add: (b: Band) => b.rules.push(i) })),
    ...columns.contacts.map((c, i) => ({ width: cell(Math.max(c.id.length, CELL_TEXT.contact)), add: (b: Band) => b.contacts.push(i) })),
    ...columns.inputs.map((x, i) => ({
      width: cell(Math.max(`${x.id} ${x.fn}`.length, CELL_TEXT.input)),
      add: (b: Band) => b.inputs.push(i),
    })),
    { width: CONTROLLER.reduce((a, b) => a + b, 0), add: (b) => (b.controller = true) },
  ];
  const bands: Band[] = [];
  let band: Band | null = null;
  let used = 0;
  for (const piece of pieces) {
    // A band always takes at least one piece, even when the conditions alone fill the page.
    if (!band || used + piece.width > pageChars) {
      band = { drive: false, rules: [], contacts: [], inputs: [], controller: false };
      bands.push(band);
      used = keyWidth;
    }
    piece.add(band);
    used += piece.width;
  }
  return bands;
}

/** What a band holds, in words, for its heading: "drive, rules 1–8" or "contacts 5–8, inputs 1–3". */
export function describeBand(b: Band, columns: TableColumns): string {
  const span = (name: string, ix: number[], of: number) =>
    ix.length === 0
      ? null
      : ix.length === of
        ? name
        : ix.length === 1
          ? `${name} ${ix[0]! + 1}`
          : `${name} ${ix[0]! + 1}–${ix.at(-1)! + 1}`;
  return [
    b.drive ? "drive" : null,
    span("rules", b.rules, columns.rules.length),
    span("contacts", b.contacts, columns.contacts.length),
    span("inputs", b.inputs, columns.inputs.length),
    b.controller ? "controller view" : null,
  ]
    .filter(Boolean)
    .join(", ");
}
