// Every subcommand of the command line, in the order the overview lists them. A new command is a module
// in this folder and one line here.
import type { Command } from "../shared";
import { proveCommand } from "./prove";
import { tableCommand } from "./table";
import { diagnoseCommand } from "./diagnose";
import { groupsCommand } from "./groups";
import { whyCommand } from "./why";
import { checkControllerCommand } from "./check-controller";
import { benchPlanCommand } from "./bench-plan";

export const COMMANDS: Command[] = [
  proveCommand,
  tableCommand,
  diagnoseCommand,
  groupsCommand,
  whyCommand,
  checkControllerCommand,
  benchPlanCommand,
];
