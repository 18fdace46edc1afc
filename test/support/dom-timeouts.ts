// Vitest setup of the unit suite: in the component tests (jsdom), findBy… and waitFor wait up to 10 s
// instead of Testing Library's 1 s. Their first wait often includes the first import of the engine
// (the live proof loads it on demand), which a cold CI machine transforms in over a second. A wait
// still ends as soon as its expectation holds, so passing tests are no slower.
if (typeof document !== "undefined") {
  const { configure } = await import("@testing-library/react");
  configure({ asyncUtilTimeout: 10_000 });
}
export {};
