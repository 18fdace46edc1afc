// `npm start`'s own AUTH_SECRET: made at random on the first start, kept in the data folder where only
// its owner can read it, and reused afterwards so sessions and mailed links survive a restart.
import { randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { authSecretProblem } from "../app/lib/auth-secret";

export function ensureAuthSecret(dataDir: string, log: (line: string) => void = () => {}): string {
  mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  const file = path.join(dataDir, "auth-secret");
  if (existsSync(file)) {
    const kept = readFileSync(file, "utf8").trim();
    if (authSecretProblem(kept, true) === null) {
      if ((statSync(file).mode & 0o077) !== 0) {
        chmodSync(file, 0o600);
        log(`${file} was readable by others; it is now readable by its owner only`);
      }
      return kept;
    }
    log(`${file} held no usable secret; a new one replaces it (signed-in sessions end)`);
  }
  const secret = randomBytes(48).toString("base64url");
  writeFileSync(file, secret + "\n", { mode: 0o600 });
  chmodSync(file, 0o600); // the mode above applies only when the file is new
  return secret;
}
