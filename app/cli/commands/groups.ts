// `chainproof groups`: the rows of a set as row groups (chainproof/groups@1, spec section 4).
import { parseArgs } from "node:util";
import { groupRows, RowSetError } from "../../engine/index";
import { fail, loadDesign, write, type Command } from "../shared";

export const groupsCommand: Command = {
  name: "groups",
  usage: "chainproof groups <design.json> --set SET",
  help: `chainproof groups <design.json> --set SET

Prints the rows of a set as row groups (chainproof/groups@1) as JSON on stdout.
A group gives some conditions a subset of their states; a condition it does not
name may be in any state. The groups are disjoint and together are exactly the set.

Sets:
  drive                       rows with steady drive
  unsafe:RULE, violating:RULE rows of an inhibit rule
  demand:RULE, failing:RULE   rows of a require-drive rule
  broken:CONTACT/MODE         with the contact stuck (stuck-open or stuck-closed),
                              the violating rows of the rules that fault defeats

Exit 0; 2 for an invalid design or a set that names an unknown rule, a rule of
the other type, an unknown component, a component that is not a contact or an
unknown mode.
`,
  async run(argv) {
    const { positionals, values } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: { set: { type: "string" } },
    });
    if (positionals.length !== 1) fail("groups takes exactly one <design.json>");
    if (values.set === undefined) fail("groups needs --set SET (for example --set drive)");
    const c = loadDesign(positionals[0]);
    try {
      await write(JSON.stringify(groupRows(c, values.set), null, 2) + "\n");
    } catch (e) {
      if (e instanceof RowSetError) fail(`--set: ${e.message}`);
      throw e;
    }
  },
};
