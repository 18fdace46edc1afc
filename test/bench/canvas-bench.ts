// Canvas figures, measured in Debian's Chromium against the standalone editor harness
// (app/canvas/bench): `npx tsx test/bench/canvas-bench.ts`.
// 1. Live proof: worker round trip (post -> validate, compile, prove -> reply) of a 20-contact
//    design (21 conditions, 2^21 rows), 50 runs, p50/p95.
// 2. 200 nodes: time from page start until 200 nodes are in the DOM, then frame times (rAF
//    deltas) while the pane is dragged for ~2 s.
import { chromium } from "playwright-core";
import { serveHarness } from "../../app/canvas/bench/serve";

const PORT = Number(process.env.CANVAS_BENCH_PORT ?? 5193);
const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))];
};
const ms = (x: number) => `${x.toFixed(1)} ms`;

const server = await serveHarness(PORT);
const browser = await chromium.launch({
  executablePath: "/usr/bin/chromium",
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"],
});
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
  console.log(`live proof, 20 contacts (2^21 rows), worker round trip over ${proof.length} runs: p50 ${ms(pct(proof, 50))}, p95 ${ms(pct(proof, 95))}, max ${ms(Math.max(...proof))}`);
  // The same 20 contacts actuated by 10 conditions (two contacts on each, as on a real vehicle).
  const typical = await page.evaluate(async () => {
    const bench = (window as unknown as { __proofBench: (r: number, c: number, k?: number) => Promise<number[]> }).__proofBench;
    return bench(50, 20, 10);
  });
  console.log(`live proof, 20 contacts on 10 conditions, worker round trip over ${typical.length} runs: p50 ${ms(pct(typical, 50))}, p95 ${ms(pct(typical, 95))}, max ${ms(Math.max(...typical))}`);

  await page.goto(`${base}?design=chain-198&conds=8`);
  const rendered = await page.waitForFunction(() => (document.querySelectorAll(".react-flow__node").length >= 200 ? performance.now() : 0), null, { timeout: 60_000 });
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
  console.log(`panning: ${frames.length} frames, frame time p50 ${ms(pct(frames, 50))}, p95 ${ms(pct(frames, 95))}, max ${ms(Math.max(...frames))}`);
} finally {
  await browser.close();
  await server.close();
}
