// `chainproof prove`: the verdict of a design as JSON.
import { parseArgs } from "node:util";
import { prove } from "../../engine/index";
import { fail, loadDesign, write, type Command } from "../shared";

export const proveCommand: Command = {
  name: "prove",
  usage: "chainproof prove <design.json>",
  help: `chainproof prove <design.json>

Checks every rule and every single contact fault, and prints the verdict
(chainproof/verdict@1) as JSON on stdout.
Exit 0 when every rule holds, 1 when one fails, 2 when the design is invalid.
`,
  async run(argv) {
    const { positionals } = parseArgs({ args: argv, allowPositionals: true, strict: true, options: {} });
    if (positionals.length !== 1) fail("prove takes exactly one <design.json>");
    const c = loadDesign(positionals[0]);
    const verdict = prove(c);
    await write(JSON.stringify(verdict, null, 2) + "\n");
    process.exitCode = verdict.ok ? 0 : 1;
  },
};
