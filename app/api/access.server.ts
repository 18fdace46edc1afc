// Finding what an API URL names (a vehicle, a bench run) for a member of its workspace, and
// reading query strings and JSON bodies through zod into the API's error shape.
import { eq } from "drizzle-orm";
import type { z } from "zod";
import { db, schema } from "~/db/client.server";
import type { Membership } from "~/auth/guard.server";
import { requireApiCaller, requireApiCan, type RequestContext } from "~/auth/context.server";
import { apiError, readJsonBody, zodFields } from "~/api/http.server";
import { jsonObjectSchema } from "~/designs/forms";
import type { Action } from "~/lib/roles";

/** Largest JSON body of the vehicle, bench-run and diagnosis endpoints. */
export const SMALL_BODY_MAX_BYTES = 64_000;

/** The query string through a schema; 400 invalid_query naming the parameter otherwise. */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.output<S> {
  const search = new URL(request.url).searchParams;
  const parsed = schema.safeParse(Object.fromEntries(search));
  if (!parsed.success) throw apiError(400, "invalid_query", "The query string has a problem.", zodFields(parsed.error));
  return parsed.data;
}

/** A JSON object body through a schema; 415/413/400 in the API's error shape otherwise. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S, what: string): Promise<z.output<S>> {
  const raw = jsonObjectSchema.safeParse(await readJsonBody(request, SMALL_BODY_MAX_BYTES));
  if (!raw.success) throw apiError(400, "invalid_body", "The request body is a JSON object.", zodFields(raw.error));
  const body = schema.safeParse(raw.data);
  if (!body.success) throw apiError(400, "invalid_body", `The ${what} has a problem.`, zodFields(body.error));
  return body.data;
}

/** Membership of the workspace a looked-up thing belongs to; not a member reads as "no such thing". */
async function memberOf(context: RequestContext, request: Request, slug: string, action: Action, notFound: Response): Promise<Membership> {
  try {
    return await requireApiCan(context, request, slug, action);
  } catch (e) {
    if (e instanceof Response && e.status === 404) throw notFound;
    throw e;
  }
}

/**
 * The vehicle named in an API URL, for a member of its workspace with one of the allowed roles.
 * Signed out: 401. No such vehicle, or not a member of its workspace: 404. Wrong role: 403.
 */
export async function requireVehicleApi(context: RequestContext, request: Request, vehicleId: string, action: Action) {
  await requireApiCaller(context, request);
  const notFound = apiError(404, "not_found", "No such vehicle.");
  // No id holds a NUL character, and PostgreSQL would refuse the query text.
  if (vehicleId.includes("\u0000")) throw notFound;
  // The one lookup by id alone: it finds the workspace whose membership is then required.
  const rows = await db
    .select({ vehicle: schema.vehicle, slug: schema.workspace.slug })
    .from(schema.vehicle)
    .innerJoin(schema.workspace, eq(schema.vehicle.workspaceId, schema.workspace.id))
    .where(eq(schema.vehicle.id, vehicleId))
    .limit(1);
  const row = rows[0];
  if (!row) throw notFound;
  const member = await memberOf(context, request, row.slug, action, notFound);
  return { member, vehicle: row.vehicle };
}

/** The bench run named in an API URL; the same answers as requireVehicleApi. */
export async function requireRunApi(context: RequestContext, request: Request, runId: string, action: Action) {
  await requireApiCaller(context, request);
  const notFound = apiError(404, "not_found", "No such bench run.");
  if (runId.includes("\u0000")) throw notFound;
  const rows = await db
    .select({ slug: schema.workspace.slug })
    .from(schema.benchRun)
    .innerJoin(schema.workspace, eq(schema.benchRun.workspaceId, schema.workspace.id))
    .where(eq(schema.benchRun.id, runId))
    .limit(1);
  const row = rows[0];
  if (!row) throw notFound;
  return { member: await memberOf(context, request, row.slug, action, notFound) };
}
