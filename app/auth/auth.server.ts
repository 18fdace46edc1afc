// better-auth: e-mail and password, verification and reset by mail, sessions in PostgreSQL.
import { betterAuth } from "better-auth";
import { APIError } from "better-auth/api";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { db, schema } from "~/db/client.server";
import { env } from "~/env.server";
import { composeMail, sendMail } from "~/mail/mailer.server";
import { forgetSessions } from "./session-cache.server";
import { userNameSchema } from "~/lib/forms";

/**
 * The sign-up form's limits on every way a user row is written, better-auth's own endpoints
 * (/api/auth/sign-up/email, /api/auth/update-user) included: 400 naming the field, nothing saved.
 */
function checkUserFields(user: { name?: unknown; image?: unknown }) {
  if (user.name !== undefined) {
    const parsed = userNameSchema.safeParse(user.name);
    if (!parsed.success) throw new APIError("BAD_REQUEST", { message: `name: ${parsed.error.issues[0]!.message}`, code: "INVALID_NAME" });
  }
  if (user.image !== undefined && user.image !== null && (typeof user.image !== "string" || user.image.length > 2000)) {
    throw new APIError("BAD_REQUEST", { message: "image: Use a URL of at most 2000 characters.", code: "INVALID_IMAGE" });
  }
}

/** Header our HTTP server sets from the socket (or a trusted proxy); never taken from the client. */
export const CLIENT_IP_HEADER = "x-chainproof-client-ip";

const origins = new Set([env.APP_URL, env.APP_URL.replace("127.0.0.1", "localhost"), env.APP_URL.replace("localhost", "127.0.0.1")]);

export const auth = betterAuth({
  appName: "Chainproof",
  baseURL: env.APP_URL,
  secret: env.AUTH_SECRET,
  trustedOrigins: [...origins],
  telemetry: { enabled: false },
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: {
      user: schema.user,
      session: schema.session,
      account: schema.account,
      verification: schema.verification,
      rateLimit: schema.rateLimit,
    },
  }),
  emailAndPassword: {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: 10,
    revokeSessionsOnPasswordReset: true,
    sendResetPassword: async ({ user, url }) => {
      await sendMail(
        composeMail(
          user.email,
          "Reset your Chainproof password",
          [
            `Hello ${user.name},`,
            "Someone asked to reset the password of this Chainproof account. If it was you, choose a new password with the link below. It works once and expires in one hour.",
            "If it was not you, ignore this message: your password stays as it is.",
          ],
          { label: "Choose a new password", url },
        ),
      );
    },
  },
  emailVerification: {
    sendOnSignUp: true,
    sendVerificationEmail: async ({ user, url }) => {
      await sendMail(
        composeMail(
          user.email,
          "Confirm your e-mail address for Chainproof",
          [`Hello ${user.name},`, "Confirm that this address is yours to finish creating your Chainproof account."],
          { label: "Confirm my address", url },
        ),
      );
    },
  },
  session: { expiresIn: 60 * 60 * 24 * 14, updateAge: 60 * 60 * 24 },
  // Sessions confirmed recently are held for a few seconds (session-cache.server.ts); ending any
  // session or changing any user drops them all, so sign-out and revocation take effect at once here.
  databaseHooks: {
    session: { delete: { after: async () => forgetSessions() }, update: { after: async () => forgetSessions() } },
    user: {
      create: { before: async (user) => void checkUserFields(user) },
      update: { before: async (user) => void checkUserFields(user), after: async () => forgetSessions() },
      delete: { after: async () => forgetSessions() },
    },
  },
  rateLimit: {
    enabled: true,
    storage: "database",
    window: 60,
    max: 600,
    customRules: {
      "/sign-in/email": { window: 60, max: env.SIGNIN_RATE_LIMIT },
      "/sign-up/email": { window: 60, max: 10 },
      "/request-password-reset": { window: 60, max: 5 },
    },
  },
  advanced: {
    ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
    useSecureCookies: env.APP_URL.startsWith("https://"),
    defaultCookieAttributes: { httpOnly: true, sameSite: "lax" },
  },
});

export type AuthSession = typeof auth.$Infer.Session;
