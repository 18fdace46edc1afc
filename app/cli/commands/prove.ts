// `chainproof prove`: the verdict of a design as JSON.
import { parseArgs } from "node:util";
import { prove } from "../../engine/index";
import { fail, loadDesign, write, type Command } from "../shared";

export const proveCommand: Command = {
  name: "prove",
  usage: "chainproof prove <design.json>",
  help: `chainproof prove <design.json>

Checks every rule (inhibit, require-drive, no-restart) and every single contact
fault, and prints the verdict (chainproof/verdict@1) as JSON on stdout.
Exit 0 when "ok": every rule holds and the vehicle drives in at least one row.
Exit 1 when a rule fails or the design never drives (a note on stderr says
which). Exit 2 when the design is invalid, one problem per stderr line with
its path; a rule whose "when" holds in no row is invalid (rules[i].when).
Single faults are one stuck contact at a time; causes shared by several
contacts (one actuator, one connector) are not covered.
`,
  async run(argv) {
    const { positionals } = parseArgs({ args: argv, allowPositionals: true, strict: true, options: {} });
    if (positionals.length !== 1) fail("prove takes exactly one <design.json>");
    const c = loadDesign(positionals[0]);
    const verdict = prove(c);
    await write(JSON.stringify(verdict, null, 2) + "\n");
    const failing = verdict.rules.filter((r) => !r.holds).map((r) => r.id);
    if (failing.length > 0)
      process.stderr.write(`chainproof: ${failing.length} of ${verdict.rules.length} rules fail: ${failing.join(", ")}\n`);
    if (verdict.driveRows === 0)
      process.stderr.write("chainproof: the design never drives (no row has steady drive), so it proves nothing\n");
    process.exitCode = verdict.ok ? 0 : 1;
  },
};
