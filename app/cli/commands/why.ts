// `chainproof why`: why an inhibit rule that forbids drive holds (chainproof/why@1, spec section 4).
import { parseArgs } from "node:util";
import { RowSetError, whyRuleHolds } from "../../engine/index";
import { fail, loadDesign, write, type Command } from "../shared";

export const whyCommand: Command = {
  name: "why",
  usage: "chainproof why <design.json> --rule ID",
  help: `chainproof why <design.json> --rule ID

Prints why an inhibit rule that forbids drive holds (chainproof/why@1) as JSON
on stdout: the rule's unsafe rows without drive, split by what keeps drive off
(the first that applies of unpowered, disabled, neutral, conflict, braking,
throttle), each part as row groups. Violating rows have no reason.

Exit 0; 2 for an invalid design, an unknown rule or a rule that is not an
inhibit rule forbidding drive.
`,
  async run(argv) {
    const { positionals, values } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: { rule: { type: "string" } },
    });
    if (positionals.length !== 1) fail("why takes exactly one <design.json>");
    if (values.rule === undefined) fail("why needs --rule ID");
    const c = loadDesign(positionals[0]);
    try {
      await write(JSON.stringify(whyRuleHolds(c, values.rule), null, 2) + "\n");
    } catch (e) {
      if (e instanceof RowSetError) fail(`--rule: ${e.message}`);
      throw e;
    }
  },
};
