// Canvas figures, measured in Debian's Chromium: `npx tsx test/bench/canvas-bench.ts`.
// 1. Live proof (standalone editor harness, app/canvas/bench): worker round trip (post -> validate,
//    compile, prove -> reply) of a 20-contact design (21 conditions, 2^21 rows), 50 runs, p50/p95.
// 2. 200 nodes (harness): time from page start until 200 nodes are in the DOM, then frame times
//    (rAF deltas) while the pane is dragged for ~2 s.
// 3. Opening the editor in the app (production build, compression on, a demo engineer signed in;
//    its own stack unless CHAINPROOF_URL names a running one): the JavaScript transferred (encoded
//    bytes of every script, workers included) and the time from navigation to a usable canvas
//    (nodes drawn and the live proof's result in the status bar), with the CPU slowed 4x and a slow
//    connection (1.6 Mbit/s down, 750 kbit/s up, 150 ms round trip), cache empty. Decision 143.
//    `--weight` runs only this part.
import { randomBytes } from "node:crypto";
import { chromium, type Browser } from "playwright-core";
import { serveHarness } from "../../app/canvas/bench/serve";
import { bringUp, run, type Stack } from "../../scripts/stack";
import { editorFirstPaint } from "../support/editor-weight";

const PORT = Number(process.env.CANVAS_BENCH_PORT ?? 5193);
const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))];
};
const ms = (x: number) => `${x.toFixed(1)} ms`;

const onlyWeight = process.argv.includes("--weight");
const browser = await chromium.launch({
  executablePath: "/usr/bin/chromium",
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"],
});
try {
  if (!onlyWeight) await harnessFigures(browser);
  await editorWeight(browser);
} finally {
  await browser.close();
}

async function harnessFigures(browser: Browser) {
  const server = await serveHarness(PORT);
  try {
    const page = await browser.newPage({ viewport: { width: 1400, height: 860 } });
    const base = `http://127.0.0.1:${PORT}/`;

    // Warm up Vite's transforms so the first measurement is not the dev server compiling.
    await page.goto(`${base}?design=empty`);
    await page.waitForSelector(".react-flow__pane");
    const proof = await page.evaluate(async () => {
      const bench = (window as unknown as { __proofBench: (r: number, c: number) => Promise<number[]> }).__proofBench;
      await bench(3, 20);
      return bench(50, 20);
    });
    console.log(
      `live proof, 20 contacts (2^21 rows), worker round trip over ${proof.length} runs: p50 ${ms(pct(proof, 50))}, p95 ${ms(pct(proof, 95))}, max ${ms(Math.max(...proof))}`,
    );
    // The same 20 contacts actuated by 10 conditions (two contacts on each, as on a real vehicle).
    const typical = await page.evaluate(async () => {
      const bench = (window as unknown as { __proofBench: (r: number, c: number, k?: number) => Promise<number[]> }).__proofBench;
      return bench(50, 20, 10);
    });
    console.log(
      `live proof, 20 contacts on 10 conditions, worker round trip over ${typical.length} runs: p50 ${ms(pct(typical, 50))}, p95 ${ms(pct(typical, 95))}, max ${ms(Math.max(...typical))}`,
    );

    await page.goto(`${base}?design=chain-198&conds=8`);
    const rendered = await page.waitForFunction(
      () => (document.querySelectorAll(".react-flow__node").length >= 200 ? performance.now() : 0),
      null,
      { timeout: 60_000 },
    );
    const renderMs = (await rendered.jsonValue()) as number;
    await page.waitForTimeout(1500);
    const count = await page.locator(".react-flow__node").count();
    // A string, not a function: tsx would add helpers to a named function that the page lacks.
    await page.evaluate(`(() => {
    window.__frames = [];
    window.__recording = true;
    let last = performance.now();
    const tick = (t) => { window.__frames.push(t - last); last = t; if (window.__recording) requestAnimationFrame(tick); };
    requestAnimationFrame(tick);
  })()`);
    const pane = (await page.locator(".react-flow__pane").boundingBox())!;
    const cx = pane.x + pane.width / 2;
    const cy = pane.y + pane.height / 2;
    for (let round = 0; round < 4; round++) {
      await page.mouse.move(cx, cy);
      await page.mouse.down();
      for (let i = 1; i <= 30; i++) await page.mouse.move(cx + (round % 2 ? -1 : 1) * i * 8, cy + i * 3);
      await page.mouse.up();
    }
    const frames = await page.evaluate(() => {
      const w = window as unknown as { __frames: number[]; __recording: boolean };
      w.__recording = false;
      return w.__frames.slice(1);
    });
    console.log(`canvas with ${count} nodes: rendered ${ms(renderMs)} after navigation start`);
    console.log(
      `panning: ${frames.length} frames, frame time p50 ${ms(pct(frames, 50))}, p95 ${ms(pct(frames, 95))}, max ${ms(Math.max(...frames))}`,
    );
  } finally {
    await server.close();
  }
}

async function editorWeight(browser: Browser) {
  let stack: Stack | null = null;
  let base = process.env.CHAINPROOF_URL ?? "";
  const offset = Number(process.env.CHAINPROOF_PORT_OFFSET ?? 0);
  try {
    if (!base) {
      stack = await bringUp({
        name: "canvas-bench",
        dataDir: ".data/canvas-bench",
        pgPort: 54359 + offset,
        database: "chainproof_canvas_bench",
        freshDatabase: true,
        smtpPort: 2555 + offset,
        s3Port: 4599 + offset,
        appPort: 3300 + offset,
        demo: true,
        authSecret: randomBytes(48).toString("base64url"),
        extraEnv: { NODE_ENV: "production", WEB_CONCURRENCY: "1" },
      });
      if ((await run("npx", ["react-router", "build"], { NODE_ENV: "production" })) !== 0) throw new Error("the build failed");
      await stack.startApp();
      base = stack.appUrl;
    }
    const runs: Array<{ files: string[]; scripts: number; encoded: number; decoded: number; usableMs: number }> = [];
    for (let i = 0; i < 3; i++) runs.push(await openEditorOnce(browser, base));
    const median = <T>(xs: T[], f: (x: T) => number) => [...xs.map(f)].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const kb = (n: number) => `${(n / 1000).toFixed(1)} kB`;
    console.log(
      `editor, opened in the app (CPU 4x slower, 1.6 Mbit/s, 150 ms RTT, cache empty; ${runs.length} runs): ` +
        `${runs[0].scripts} scripts, ${kb(runs[0].encoded)} of JavaScript transferred (${kb(runs[0].decoded)} uncompressed); ` +
        `usable canvas after ${ms(median(runs, (r) => r.usableMs))} (median; runs: ${runs.map((r) => ms(r.usableMs)).join(", ")})`,
    );
    // What weighs: the first paint's chunks as the build lays them out (test/support/editor-weight.ts,
    // the same count as the size check), largest first.
    let build: ReturnType<typeof editorFirstPaint> | null = null;
    try {
      build = editorFirstPaint();
    } catch (e) {
      console.log(`(no local build to break down: ${e instanceof Error ? e.message : String(e)})`);
    }
    if (build) {
      console.log(`first paint in the build: ${build.chunks.length} files, ${kb(build.gzip)} gzip (${kb(build.raw)} raw); largest:`);
      for (const c of build.chunks.slice(0, 8)) console.log(`  ${kb(c.gzip).padStart(9)}  ${c.file}  (${c.why})`);
      const counted = new Set(build.chunks.map((c) => c.file));
      const fetched = new Set(runs[0].files);
      const onlyFetched = [...fetched].filter((f) => !counted.has(f));
      const onlyCounted = [...counted].filter((f) => !fetched.has(f));
      if (onlyFetched.length + onlyCounted.length > 0)
        console.log(
          `  the browser fetched but the build count leaves out: ${onlyFetched.join(", ") || "nothing"}; counted but not fetched: ${onlyCounted.join(", ") || "nothing"}`,
        );
    }
    console.log(
      JSON.stringify({
        editorOpen: {
          scripts: runs[0].scripts,
          jsTransferredBytes: runs[0].encoded,
          jsUncompressedBytes: runs[0].decoded,
          usableCanvasMs: runs.map((r) => Math.round(r.usableMs)),
          usableCanvasMedianMs: Math.round(median(runs, (r) => r.usableMs)),
          conditions: "Chromium CPU 4x slower, 1.6 Mbit/s down, 750 kbit/s up, 150 ms RTT, cache empty",
          buildFirstPaintGzipBytes: build?.gzip ?? null,
          budgetBytes: 300_000,
        },
      }),
    );
  } finally {
    await stack?.stop();
  }
}

/** One cold open of the demo design's editor; counts every script response of the page and its workers. */
async function openEditorOnce(browser: Browser, base: string) {
  const context = await browser.newContext({
    viewport: { width: 1440, height: 900 },
    extraHTTPHeaders: { "x-forwarded-for": "198.18.77.1" },
  });
  try {
    const page = await context.newPage();
    await page.goto(`${base}/sign-in`);
    await page.getByLabel("E-mail").fill("engineer@example.com");
    await page.getByLabel("Password").fill("chainproof-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
    const list = await page.request.get(`${base}/api/v1/designs?workspace=larkspur`);
    const { designs } = (await list.json()) as { designs: Array<{ id: string; name: string }> };
    const design = designs.find((d) => d.name.startsWith("Haybarn")) ?? designs[0];

    const cdp = await context.newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.setCacheDisabled", { cacheDisabled: true });
    await cdp.send("Network.emulateNetworkConditions", {
      offline: false,
      latency: 150,
      downloadThroughput: (1.6e6 / 8) * 0.9,
      uploadThroughput: (750e3 / 8) * 0.9,
    });
    await cdp.send("Emulation.setCPUThrottlingRate", { rate: 4 });

    const scripts: Array<Promise<{ file: string; encoded: number; decoded: number }>> = [];
    context.on("response", (res) => {
      const url = res.url();
      if (!/\.m?js(\?|$)/.test(new URL(url).pathname)) return;
      scripts.push(
        (async () => {
          const [sizes, body] = await Promise.all([res.request().sizes(), res.body().catch(() => Buffer.alloc(0))]);
          return { file: new URL(url).pathname.replace(/^.*\//, ""), encoded: sizes.responseBodySize, decoded: body.length };
        })(),
      );
    });
    await page.goto(`${base}/w/larkspur/designs/${design.id}/edit`);
    const usable = await page.waitForFunction(
      () => {
        const nodes = document.querySelectorAll(".react-flow__node").length;
        const status = document.querySelector("[data-testid=proof-status]")?.textContent ?? "";
        return nodes > 0 && status !== "" && !status.startsWith("Checking") ? performance.now() : 0;
      },
      null,
      { timeout: 120_000, polling: 50 },
    );
    const usableMs = (await usable.jsonValue()) as number;
    await page.waitForLoadState("networkidle");
    const sizes = await Promise.all(scripts);
    return {
      files: sizes.map((x) => x.file),
      scripts: sizes.length,
      encoded: sizes.reduce((a, s) => a + s.encoded, 0),
      decoded: sizes.reduce((a, s) => a + s.decoded, 0),
      usableMs,
    };
  } finally {
    await context.close();
  }
}
