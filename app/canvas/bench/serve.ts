// Serves the canvas harness with Vite (no React Router plugin): `tsx app/canvas/bench/serve.ts [port]`.
import path from "node:path";
import tailwindcss from "@tailwindcss/vite";
import { createServer, type ViteDevServer } from "vite";

export async function serveHarness(port: number): Promise<ViteDevServer> {
  const root = path.resolve(import.meta.dirname);
  const repo = path.resolve(root, "../../..");
  const server = await createServer({
    configFile: false,
    root,
    plugins: [tailwindcss()],
    resolve: { alias: { "~": path.join(repo, "app") } },
    server: { host: "127.0.0.1", port, strictPort: true, fs: { allow: [repo, path.resolve(repo, "../shared")] } },
    worker: { format: "es" },
    logLevel: "warn",
  });
  await server.listen();
  return server;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const port = Number(process.argv[2] ?? 5190);
  await serveHarness(port);
  console.log(`canvas harness on http://127.0.0.1:${port}/`);
}
