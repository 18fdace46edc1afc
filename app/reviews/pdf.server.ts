// Printing the report to PDF with the installed Chromium (playwright-core). One print at a time per
// process (the machine is small and a print takes a browser), one print at a time per user across every
// process and machine (a PostgreSQL advisory lock), and a print whose requester has gone is stopped.
// The page is opened at the app's own URL with the requester's cookie, so the PDF shows exactly what
// that member may see.
import { chromium, type Browser } from "playwright-core";
import { env } from "~/env.server";
import { pool } from "~/db/client.server";

const ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"];
let queue: Promise<unknown> = Promise.resolve();

/** The user already has a print running or waiting. */
export class PrintBusyError extends Error {}

export async function printPdf(
  path: string,
  cookie: string,
  format: "A4" | "Letter",
  opts: { userId: string; signal: AbortSignal },
): Promise<Buffer> {
  const client = await pool.connect();
  try {
    const locked = await client.query<{ ok: boolean }>("SELECT pg_try_advisory_lock(hashtext($1)) AS ok", [`report-pdf:${opts.userId}`]);
    if (!locked.rows[0]?.ok) throw new PrintBusyError("A report of yours is being printed; wait for it to finish.");
    try {
      return await inTurn(() => print(path, cookie, format, opts.signal));
    } finally {
      await client.query("SELECT pg_advisory_unlock(hashtext($1))", [`report-pdf:${opts.userId}`]).catch(() => {});
    }
  } finally {
    client.release();
  }
}

function inTurn<T>(run: () => Promise<T>): Promise<T> {
  const next = queue.then(run, run);
  queue = next.catch(() => undefined);
  return next;
}

async function print(path: string, cookie: string, format: "A4" | "Letter", signal: AbortSignal): Promise<Buffer> {
  signal.throwIfAborted();
  let browser: Browser | null = null;
  const stop = () => void browser?.close().catch(() => {});
  signal.addEventListener("abort", stop, { once: true });
  try {
    browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ARGS });
    signal.throwIfAborted();
    const context = await browser.newContext({ extraHTTPHeaders: cookie ? { cookie } : {} });
    const page = await context.newPage();
    const url = new URL(path, env.APP_URL);
    const res = await page.goto(url.toString(), { waitUntil: "networkidle", timeout: 30_000 });
    if (!res || !res.ok()) throw new Error(`the report page answered ${res?.status() ?? "nothing"}`);
    await page.emulateMedia({ media: "print" });
    return await page.pdf({ format, printBackground: true, preferCSSPageSize: true });
  } finally {
    signal.removeEventListener("abort", stop);
    await browser?.close().catch(() => {});
  }
}
