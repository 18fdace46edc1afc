// The layout of the JSON API /api/v1: its middleware looks up the caller (session or personal API
// key) once per request (docs/decisions/151). Each endpoint still asks for what it needs
// (requireApiCan, requireDesign…); the public OpenAPI document asks nothing.
import type { Route } from "./+types/layout";
import { apiCaller } from "~/auth/context.server";

export const middleware: Route.MiddlewareFunction[] = [apiCaller];
