// The secret that signs sessions and better-auth's e-mail tokens (issue 11, critical): production
// refuses the built-in development value and anything under 32 bytes; the start command makes one
// secret per install, readable by its owner only, and keeps it across restarts.
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync, chmodSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { authSecretProblem, DEVELOPMENT_AUTH_SECRET } from "../../../app/lib/auth-secret";
import { parseEnv } from "../../../app/env.server";
import { ensureAuthSecret } from "../../../scripts/auth-secret";

describe("the auth secret's check", () => {
  it("refuses, in production, a missing secret, the built-in development value and one under 32 bytes", () => {
    expect(authSecretProblem(undefined, true)).toMatch(/AUTH_SECRET is not set/);
    expect(authSecretProblem(DEVELOPMENT_AUTH_SECRET, true)).toMatch(/built-in development value/);
    expect(authSecretProblem("x".repeat(31), true)).toMatch(/31 bytes; it needs at least 32/);
    // Bytes, not characters: 16 two-byte characters are 32 bytes.
    expect(authSecretProblem("é".repeat(16), true)).toBeNull();
    expect(authSecretProblem("a".repeat(32), true)).toBeNull();
  });

  it("lets development and tests run on the built-in value", () => {
    expect(authSecretProblem(undefined, false)).toBeNull();
    expect(authSecretProblem(DEVELOPMENT_AUTH_SECRET, false)).toBeNull();
  });

  it("the environment parser refuses a production start without a secret of its own, naming AUTH_SECRET", () => {
    expect(() => parseEnv({ NODE_ENV: "production" })).toThrow(/AUTH_SECRET is not set/);
    expect(() => parseEnv({ NODE_ENV: "production", AUTH_SECRET: DEVELOPMENT_AUTH_SECRET })).toThrow(/AUTH_SECRET.*built-in/);
    expect(() => parseEnv({ NODE_ENV: "production", AUTH_SECRET: "short-secret" })).toThrow(/AUTH_SECRET/);
    const secret = "k".repeat(40);
    expect(parseEnv({ NODE_ENV: "production", AUTH_SECRET: secret }).AUTH_SECRET).toBe(secret);
    expect(parseEnv({ NODE_ENV: "development" }).AUTH_SECRET).toBe(DEVELOPMENT_AUTH_SECRET);
  });
});

describe("the start command's secret file", () => {
  let dir = "";
  afterEach(() => {
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it("is created on first start, random, readable by its owner only, and reused afterwards", () => {
    dir = mkdtempSync(path.join(tmpdir(), "chainproof-secret-"));
    const first = ensureAuthSecret(dir);
    expect(authSecretProblem(first, true)).toBeNull();
    const file = path.join(dir, "auth-secret");
    expect(readFileSync(file, "utf8").trim()).toBe(first);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(ensureAuthSecret(dir)).toBe(first);

    const other = mkdtempSync(path.join(tmpdir(), "chainproof-secret-"));
    try {
      expect(ensureAuthSecret(other)).not.toBe(first);
    } finally {
      rmSync(other, { recursive: true, force: true });
    }
  });

  it("tightens a secret file others can read, and replaces one too short to use", () => {
    dir = mkdtempSync(path.join(tmpdir(), "chainproof-secret-"));
    const file = path.join(dir, "auth-secret");
    const kept = "s".repeat(48);
    writeFileSync(file, kept + "\n");
    chmodSync(file, 0o644);
    expect(ensureAuthSecret(dir)).toBe(kept);
    expect(statSync(file).mode & 0o777).toBe(0o600);

    writeFileSync(file, "short\n");
    const replaced = ensureAuthSecret(dir);
    expect(replaced).not.toBe("short");
    expect(authSecretProblem(replaced, true)).toBeNull();
  });
});
