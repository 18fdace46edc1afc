// Vitest setup of the integration and fault suites: every fetch to the app's /api/v1 has its answer
// checked against the endpoint table (test/support/answers.ts), so a test that reaches an endpoint
// fails when the answer breaks the contract, whatever else the test asserts. Servers a test starts
// itself on other loopback ports (two processes on one database) are the same app: checked too.
import { appendFileSync, mkdirSync } from "node:fs";
import { afterAll } from "vitest";
import { BASE_URL } from "./http";
import { checkAnswer, seenAnswers } from "./answers";

/** Where each test file adds the answers it saw: npm test counts them against the endpoint table. */
export const SEEN_ANSWERS_FILE = ".data/test-results/api-answers-seen.txt";
afterAll(() => {
  if (seenAnswers.size === 0) return;
  mkdirSync(".data/test-results", { recursive: true });
  appendFileSync(SEEN_ANSWERS_FILE, [...seenAnswers].map((a) => `${a}\n`).join(""));
});

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
