// `chainproof table`: the truth table, streamed as aligned text or CSV.
import { parseArgs } from "node:util";
import { csvChunks, filterRuleType, ROW_FILTERS, textTableChunks, type RowFilter } from "../../engine/index";
import { fail, loadDesign, nonNegativeInt, parseRow, write, type Command } from "../shared";

export const tableCommand: Command = {
  name: "table",
  usage:
    "chainproof table <design.json> [--csv] [--from N] [--count M] [--only unsafe|violating|drive|demand|failing] [--rule ID] [--where COND=S1|S2,...]",
  help: `chainproof table <design.json> [options]

Prints the truth table, one row per line, streamed. Default output is an aligned
text table with a header line; --csv prints CSV instead. Columns: row, each
condition, input:ID (1 energized, 0 dead), powered, enabled, direction, braking,
throttle, drive (steady drive), rule:ID per inhibit rule (violating, unsafe, or -)
and per require-drive rule (failing: a demand row without drive, demand, or -).

Options:
  --csv                         CSV output
  --only unsafe|violating|drive|demand|failing
                                keep only these rows (unsafe/violating: for any
                                inhibit rule, demand/failing: for any require-
                                drive rule, or the one named by --rule)
  --rule ID                     the rule for --only: an inhibit rule for
                                unsafe|violating, a require-drive rule for
                                demand|failing
  --where COND=S1|S2,...        keep rows whose conditions are in the listed states
  --from N                      skip the first N matching rows (default 0)
  --count M                     print at most M rows (default: all)
`,
  async run(argv) {
    const { positionals, values } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        csv: { type: "boolean" },
        from: { type: "string" },
        count: { type: "string" },
        only: { type: "string" },
        rule: { type: "string" },
        where: { type: "string" },
      },
    });
    if (positionals.length !== 1) fail("table takes exactly one <design.json>");
    const from = nonNegativeInt(values.from, "--from");
    const count = nonNegativeInt(values.count, "--count");
    if (values.only !== undefined && !(ROW_FILTERS as readonly string[]).includes(values.only)) {
      fail(
        `--only must be ${ROW_FILTERS.slice(0, -1).join(", ")} or ${ROW_FILTERS[ROW_FILTERS.length - 1]}, got ${JSON.stringify(values.only)}`,
      );
    }
    const c = loadDesign(positionals[0]);
    const filter: RowFilter = {};
    if (values.only) filter.only = values.only as RowFilter["only"];
    if (values.rule !== undefined) {
      const rule = c.rules.find((r) => r.id === values.rule);
      if (!rule) fail(`--rule: no rule with id ${JSON.stringify(values.rule)}`);
      const type = filterRuleType(filter.only);
      if (rule.type !== type) {
        fail(
          `--rule: ${JSON.stringify(values.rule)} is not ${type === "inhibit" ? "an inhibit" : "a require-drive"} rule${type === "inhibit" ? " (use --only demand or failing for a require-drive rule)" : ""}`,
        );
      }
      filter.rule = values.rule;
    }
    if (values.where !== undefined) {
      const where: Record<string, string[]> = {};
      for (const [k, v] of Object.entries(parseRow(values.where, "--where"))) {
        const cond = c.conditions[c.conditionIndex[k]];
        if (!cond) fail(`--where: no condition with id ${JSON.stringify(k)}`);
        const states = v.split("|");
        for (const s of states)
          if (!cond.states.includes(s)) fail(`--where: ${JSON.stringify(s)} is not a state of condition ${JSON.stringify(k)}`);
        where[k] = states;
      }
      filter.where = where;
    }
    const chunks = values.csv ? csvChunks(c, filter, { from, count }) : textTableChunks(c, filter, { from, count });
    for (const chunk of chunks) await write(chunk);
  },
};
