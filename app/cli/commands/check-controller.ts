// `chainproof check-controller`: a vehicle's controller settings record, its derived values and findings,
// optionally against the design whose proof it must carry (controller-record.md section 5).
import { parseArgs } from "node:util";
import { checkRecord, hasErrors, parseRecord, CONTROLLER_RECORD_FORMAT } from "../../controller-record/index";
import { validateDesign } from "../../engine/index";
import { InvalidDesign, fail, printProblems, readJsonFile, write, type Command } from "../shared";

export const checkControllerCommand: Command = {
  name: "check-controller",
  usage: "chainproof check-controller <record.json> [--design <design.json>]",
  help: `chainproof check-controller <record.json> [--design <design.json>]

Checks a controller settings record (${CONTROLLER_RECORD_FORMAT}): the pack's voltage window,
currents in amps, precharge times and the throttle's classes, and what the settings contradict
(cut-back below the pack's minimum, a throttle at rest that does not read released, ...). With
--design, also what the design's proof assumes of the controller and the record lacks (a lockout,
the brake's behaviour). Prints chainproof/controller-check@1 JSON on stdout.

The record is what was written down, not what the controller holds: verify on the vehicle and
follow the controller maker's documentation and local practice.

Exit 0 without error findings (warnings allowed), 1 with at least one error finding, 2 when the
record or the design is invalid (each problem on stderr, starting with its field path).
`,
  async run(argv) {
    const { positionals, values } = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: { design: { type: "string" } },
    });
    if (positionals.length !== 1) fail("check-controller takes exactly one <record.json>");
    const [recordFile] = positionals;
    const record = parseRecord(readJsonFile(recordFile));
    const design = values.design === undefined ? undefined : validateDesign(readJsonFile(values.design));
    let invalid = false;
    if (!record.ok) {
      process.stderr.write(`chainproof: ${recordFile} is not a valid controller settings record:\n`);
      printProblems(record.problems);
      invalid = true;
    }
    if (design && !design.ok) {
      process.stderr.write(`chainproof: ${values.design} is not a valid design:\n`);
      printProblems(design.problems);
      invalid = true;
    }
    if (invalid || !record.ok || (design && !design.ok)) throw new InvalidDesign();
    const check = checkRecord(record.record, design?.design, record.derived);
    await write(JSON.stringify(check, null, 2) + "\n");
    process.exitCode = hasErrors(check.findings) ? 1 : 0;
  },
};
