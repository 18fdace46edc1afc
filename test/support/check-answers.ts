// Vitest setup of the integration and fault suites: every fetch to the app's /api/v1 has its answer
// checked against the endpoint table (test/support/answers.ts), so a test that reaches an endpoint
// fails when the answer breaks the contract, whatever else the test asserts. Servers a test starts
// itself on other loopback ports (two processes on one database) are the same app: checked too.
import { BASE_URL } from "./http";
import { checkAnswer } from "./answers";

const realFetch = globalThis.fetch;
const appHost = new URL(BASE_URL).hostname;

globalThis.fetch = async (input: RequestInfo | URL, init?: RequestInit): Promise<Response> => {
  const res = await realFetch(input, init);
  const url = new URL(input instanceof Request ? input.url : String(input));
  if (url.hostname === appHost && url.pathname.startsWith("/api/v1/")) {
    const method = init?.method ?? (input instanceof Request ? input.method : "GET");
    await checkAnswer(method, url.pathname, res.clone());
  }
  return res;
};
