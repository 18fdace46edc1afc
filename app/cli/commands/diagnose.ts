// `chainproof diagnose`: why one row drives or not, as JSON or text.
import { parseArgs } from "node:util";
import { diagnose, type CompiledDesign, type Diagnosis } from "../../engine/index";
import { checkRow, fail, loadDesign, parseRow, write, type Command } from "../shared";

function diagnosisText(c: CompiledDesign, d: Diagnosis): string {
  const lines: string[] = [];
  lines.push(
    `Row ${d.row}: ${Object.entries(d.states)
      .map(([k, v]) => `${k}=${v}`)
      .join(", ")}`,
  );
  const ctl = d.controller;
  lines.push(
    `Controller: ${ctl.powered ? "powered" : "unpowered"}, ${ctl.enabled ? "enabled" : "not enabled"}, direction ${ctl.direction}, ` +
      `${ctl.braking ? "braking" : "not braking"}, throttle ${ctl.throttle}`,
  );
  lines.push(`Drive: ${d.drive ? "ON" : "off"}${d.latched ? " (lockout latched)" : ""}`);
  for (const r of d.reasons) lines.push(`  - ${r.message}`);
  for (const input of d.inputs) {
    if (input.energized) {
      lines.push(`Input ${input.input} (${input.function}): live`);
      continue;
    }
    lines.push(`Input ${input.input} (${input.function}): dead`);
    if (input.unreachable) lines.push("    no contact can energize it: it is not wired towards any supply");
    for (const fix of input.fixes) {
      lines.push(`    close ${fix.map((k) => `${k.contact} (${k.condition} in ${k.closeIn.join("|")})`).join(" and ")}`);
    }
    if (input.truncated) lines.push("    (more sets of the same size exist)");
  }
  void c;
  return lines.join("\n") + "\n";
}

export const diagnoseCommand: Command = {
  name: "diagnose",
  usage: "chainproof diagnose <design.json> --row COND=STATE,... [--history COND=STATE,...]... [--text]",
  help: `chainproof diagnose <design.json> --row COND=STATE,... [options]

Explains one row: the controller's view, whether it drives, for each dead input
the smallest sets of open contacts whose closing would energize it, and every
reason the drive is off. --row must name a state for every condition.

Options:
  --row COND=STATE,...      the row to explain (required)
  --history COND=STATE,...  an earlier step (repeat, oldest first); with history
                            the row is replayed after it from power-up, so a
                            latched lockout is reported
  --text                    plain text instead of JSON
`,
  async run(argv) {
    const { positionals, values } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        row: { type: "string" },
        history: { type: "string", multiple: true },
        text: { type: "boolean" },
      },
    });
    if (positionals.length !== 1) fail("diagnose takes exactly one <design.json>");
    if (values.row === undefined) fail("diagnose needs --row COND=STATE,...");
    const rowText = values.row;
    const c = loadDesign(positionals[0]);
    const row = parseRow(rowText, "--row");
    checkRow(c, row, "--row");
    const history = values.history?.map((h, i) => {
      const states = parseRow(h, `--history #${i + 1}`);
      checkRow(c, states, `--history #${i + 1}`);
      return states;
    });
    const d = diagnose(c, row, { history });
    await write(values.text ? diagnosisText(c, d) : JSON.stringify(d, null, 2) + "\n");
  },
};
