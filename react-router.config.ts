import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // The whole route manifest goes out with the first page: no per-request partial manifest to
  // compute on the server and no /__manifest round trips while navigating (docs/decisions/092).
  routeDiscovery: { mode: "initial" },
  // Route middleware with a typed context: the workspace and API layouts find who is asking once
  // per request (docs/decisions/151).
  future: { v8_middleware: true },
} satisfies Config;
