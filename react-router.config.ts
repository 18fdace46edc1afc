import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // The whole route manifest goes out with the first page: no per-request partial manifest to
  // compute on the server and no /__manifest round trips while navigating (docs/decisions/092).
  routeDiscovery: { mode: "initial" },
} satisfies Config;
