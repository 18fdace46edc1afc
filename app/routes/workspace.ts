// The layout of everything under /w/:ws (the shell's pages, the report, its PDF, uploaded files):
// its middleware finds the member once per request (docs/decisions/151). It renders only its
// children; each child's loader and action still states the role it needs with requireCan.
import type { Route } from "./+types/workspace";
import { workspaceMember } from "~/auth/context.server";

export const middleware: Route.MiddlewareFunction[] = [workspaceMember];
