// Command line for the proof engine: one module per command under commands/.
// Exit codes: 0 success (prove: every rule holds), 1 a rule fails (prove), 2 invalid design or usage.
import { COMMANDS } from "./commands/index";
import { InvalidDesign, UsageError, fail, write } from "./shared";

const HELP = `chainproof - proves drive-inhibit wiring designs (format chainproof/design@1)
and checks controller settings records against them

Usage:
${COMMANDS.map((c) => `  ${c.usage}`).join("\n")}
  chainproof <command> --help

Exit codes: 0 success (prove: every rule holds), 1 prove found a failing rule or
check-controller an error finding, 2 invalid design or record, unreadable file or
bad usage. Problems of a document go to stderr, one per line, each starting with
its field path ("(root)" for the document).
`;

async function main(argv: string[]): Promise<void> {
  const [name, ...rest] = argv;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    await write(HELP);
    return;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) fail(`unknown command ${JSON.stringify(name)}`);
  if (rest.includes("--help") || rest.includes("-h")) {
    await write(command.help);
    return;
  }
  await command.run(rest);
}

main(process.argv.slice(2)).catch((e: unknown) => {
  if (e instanceof InvalidDesign) {
    process.exitCode = 2;
    return;
  }
  if (e instanceof UsageError || (e as { code?: string }).code?.startsWith("ERR_PARSE_ARGS")) {
    process.stderr.write(`chainproof: ${(e as Error).message}\nRun "chainproof --help" for usage.\n`);
    process.exitCode = 2;
    return;
  }
  if ((e as { code?: string }).code === "EPIPE") return;
  process.stderr.write(`chainproof: internal error: ${(e as Error).message ?? String(e)}\n`);
  process.exitCode = 3;
});
