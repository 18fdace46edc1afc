// Form schemas shared by the page (immediate feedback) and the action (the authority).
import { z } from "zod";
import { ID_MAX, storable } from "./text";
import { ROLES } from "./roles";

export type FieldErrors = Record<string, string>;

/** First message per field path, e.g. { email: "Enter an e-mail address." }. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    // A repeated field's error (reviewers.2) belongs to the field: the form has one control for it.
    const key = issue.path.filter((p) => typeof p !== "number").join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

export function formObject(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of form) if (typeof v === "string") out[k] = v;
  return out;
}

const email = z.string().trim().toLowerCase().email("Enter an e-mail address such as name@company.com.");
const password = z.string().min(10, "Use at least 10 characters.").max(128, "Use at most 128 characters.");

/** A person's name: the sign-up form, and better-auth's own sign-up and update-user endpoints (auth.server.ts). */
export const USER_NAME_MAX = 100;
export const userNameSchema = storable(
  z.string().trim().min(1, "Enter your name.").max(USER_NAME_MAX, `Use at most ${USER_NAME_MAX} characters.`),
);

export const signInSchema = z.object({ email, password: z.string().min(1, "Enter your password.") });
export const signUpSchema = z.object({
  name: userNameSchema,
  email,
  password,
});
export const forgotSchema = z.object({ email });
export const resetSchema = z.object({
  token: storable(z.string().min(1, "The reset link is incomplete.").max(500, "The reset link is not valid.")),
  password,
});
export const inviteSchema = z.object({ email, role: z.enum(ROLES, { message: "Choose a role." }) });
export const roleChangeSchema = z.object({
  memberId: storable(z.string().min(1, "Choose a member.").max(ID_MAX, "No such member.")),
  role: z.enum(ROLES, { message: "Choose a role." }),
});
export const workspaceSchema = z.object({
  name: storable(z.string().trim().min(2, "Use at least 2 characters.").max(80, "Use at most 80 characters.")),
});
export const vehicleSchema = z.object({
  name: storable(z.string().trim().min(1, "Enter a name.").max(120, "Use at most 120 characters.")),
  serial: storable(z.string().trim().max(64, "Use at most 64 characters.")).default(""),
  model: storable(z.string().trim().max(120, "Use at most 120 characters.")).default(""),
  controllerDescription: storable(z.string().trim().max(2000, "Use at most 2000 characters.")).default(""),
  notes: storable(z.string().trim().max(5000, "Use at most 5000 characters.")).default(""),
});
