// The secret that signs sessions and better-auth's e-mail tokens (verification, change of address,
// reset). Whoever knows it can sign those tokens for any account, so production never runs on a value
// written in this repository (issue 11). Pure: the environment parser and the server's start-up share it.

/** Development and tests only (the Vite dev server, unit tests, the command line): public, never for serving. */
export const DEVELOPMENT_AUTH_SECRET = "chainproof-local-development-secret-change-me";

export const AUTH_SECRET_MIN_BYTES = 32;

/** Why `secret` cannot serve (null: it can). Outside production the built-in value stands in for a missing one. */
export function authSecretProblem(secret: string | undefined, production: boolean): string | null {
  if (!production) return null;
  if (secret === undefined || secret === "") {
    return "AUTH_SECRET is not set. Production needs a random secret of at least 32 bytes, for example `openssl rand -base64 48` (`npm start` makes and keeps one in .data/auth-secret).";
  }
  if (secret === DEVELOPMENT_AUTH_SECRET) {
    return "AUTH_SECRET is the built-in development value, which is public: anyone could sign e-mail tokens for any account. Set a random secret of at least 32 bytes.";
  }
  const bytes = new TextEncoder().encode(secret).length;
  if (bytes < AUTH_SECRET_MIN_BYTES)
    return `AUTH_SECRET is ${bytes} bytes; it needs at least ${AUTH_SECRET_MIN_BYTES} (a random one, for example \`openssl rand -base64 48\`).`;
  return null;
}
