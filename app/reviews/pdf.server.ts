// Printing the report to PDF with the installed Chromium (playwright-core). One print at a time:
// the machine is small and a print takes a browser. The page is opened at the app's own URL with
// the requester's cookie, so the PDF shows exactly what that member may see.
import { chromium } from "playwright-core";
import { env } from "~/env.server";

const ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"];
let queue: Promise<unknown> = Promise.resolve();

export function printPdf(path: string, cookie: string, format: "A4" | "Letter"): Promise<Buffer> {
  const run = async () => {
    const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ARGS });
    try {
      const context = await browser.newContext({ extraHTTPHeaders: cookie ? { cookie } : {} });
      const page = await context.newPage();
      const url = new URL(path, env.APP_URL);
      const res = await page.goto(url.toString(), { waitUntil: "networkidle", timeout: 30_000 });
      if (!res || !res.ok()) throw new Error(`the report page answered ${res?.status() ?? "nothing"}`);
      await page.emulateMedia({ media: "print" });
      return await page.pdf({ format, printBackground: true, preferCSSPageSize: true });
    } finally {
      await browser.close();
    }
  };
  const next = queue.then(run, run);
  queue = next.catch(() => undefined);
  return next;
}
