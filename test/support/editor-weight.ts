// What the editor's first paint downloads, read from the production build (build/client), and its
// compressed size: the entry, the route modules from the root to the editor route and every chunk
// they import statically; the canvas editor chunk the route lazy-loads at once on mount, with its
// static imports; and the workers that chunk starts on mount. Chunks the editor imports with
// import() only when a panel, the simulation or the validator is used are left out, and so is the
// layout worker (elkjs), started only when auto-layout runs (decision 143). Used by the canvas
// benchmark (which also measures what the browser really transfers) and by the size check test.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

/** The route modules from the root to the design editor (app/routes.ts). */
export const EDITOR_ROUTE_CHAIN = ["root", "routes/workspace-shell", "routes/design-editor"];
/** Workers that start only on a user's action. */
const WORKERS_ON_USE = [/^layout\.worker-/];

export type Chunk = { file: string; raw: number; gzip: number; why: string };

export function editorFirstPaint(buildDir = "build/client"): { chunks: Chunk[]; gzip: number; raw: number } {
  const assets = path.join(buildDir, "assets");
  const files = readdirSync(assets);
  const manifestFile = files.find((f) => /^manifest-.*\.js$/.test(f));
  if (!manifestFile) throw new Error(`no route manifest in ${assets}: run the build first`);
  const manifest = JSON.parse(
    readFileSync(path.join(assets, manifestFile), "utf8")
      .replace(/^window\.__reactRouterManifest\s*=\s*/, "")
      .replace(/;\s*$/, ""),
  ) as { entry: { module: string; imports?: string[] }; routes: Record<string, { module: string; imports?: string[] }> };

  const why = new Map<string, string>();
  const read = (file: string) => readFileSync(path.join(assets, file), "utf8");
  const base = (url: string) => url.replace(/^.*\//, "");
  const add = (file: string, reason: string) => {
    if (why.has(file)) return;
    why.set(file, reason);
    const text = read(file);
    // Static imports of a chunk: `import ... from"./x.js"`, `import"./x.js"`, `export ... from"./x.js"`.
    for (const m of text.matchAll(/(?:from|import)\s*["'`]\.\/([^"'`]+\.js)["'`]/g)) add(m[1], `imported by ${file}`);
    // Workers started by this chunk: new Worker(new URL(`/assets/x.worker-…js`, import.meta.url)).
    for (const m of text.matchAll(/new URL\(\s*["'`](?:\/assets\/|\.\/)([^"'`]+\.worker-[^"'`]+\.js)["'`]/g)) {
      if (!WORKERS_ON_USE.some((re) => re.test(m[1]))) add(m[1], `worker started by ${file}`);
    }
  };

  why.set(manifestFile, "route manifest");
  add(base(manifest.entry.module), "entry");
  for (const i of manifest.entry.imports ?? []) add(base(i), "entry");
  for (const id of EDITOR_ROUTE_CHAIN) {
    const route = manifest.routes[id];
    if (!route) throw new Error(`route ${id} is not in the manifest`);
    add(base(route.module), `route ${id}`);
    for (const i of route.imports ?? []) add(base(i), `route ${id}`);
  }
  // The canvas: app/canvas/design-editor.tsx lazy-loads ./editor as soon as it mounts.
  const routeModule = read(base(manifest.routes["routes/design-editor"].module));
  const canvas = [...routeModule.matchAll(/import\(\s*["'`]\.\/(editor-[^"'`]+\.js)["'`]\s*\)/g)].map((m) => m[1]);
  if (canvas.length !== 1) throw new Error(`expected the editor route to lazy-load one editor chunk, found ${canvas.length}`);
  add(canvas[0], "the canvas, loaded on mount");

  const chunks = [...why].map(([file, reason]) => {
    const bytes = readFileSync(path.join(assets, file));
    // The server compresses with the compression package's default, zlib's level 6.
    return { file, raw: bytes.length, gzip: gzipSync(bytes, { level: 6 }).length, why: reason };
  });
  chunks.sort((a, b) => b.gzip - a.gzip);
  return { chunks, gzip: chunks.reduce((a, c) => a + c.gzip, 0), raw: chunks.reduce((a, c) => a + c.raw, 0) };
}
