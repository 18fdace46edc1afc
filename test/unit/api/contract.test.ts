// The API contract itself: the endpoint table is consistent (path parameters, the answers every
// endpoint can give), the test-side check refuses answers that break it, and the browser client
// parses answers with the same schemas.
import { describe, expect, it } from "vitest";
import { api, ENDPOINTS, endpointOf } from "../../../app/api/endpoints";
import { ApiError, apiUrl, readAnswer } from "../../../app/api/client";
import { AnswerMismatch, checkAnswer } from "../../support/answers";

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } });
const error = (code: string, message: string) => ({ error: { code, message, fields: [] } });

describe("the endpoint table", () => {
  it("names the same path parameters in each path and its params schema", () => {
    for (const e of ENDPOINTS) {
      const inPath = [...e.path.matchAll(/\{([A-Za-z]+)\}/g)].map((m) => m[1]).sort();
      expect(Object.keys(e.params?.shape ?? {}).sort(), e.path).toEqual(inPath);
    }
  });

  it("has one endpoint per method and path", () => {
    const keys = ENDPOINTS.map((e) => `${e.method} ${e.path}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it("declares the answers every endpoint can give: rate limit, server error, database down; 401 and 404 unless public", () => {
    for (const e of ENDPOINTS) {
      const statuses = Object.keys(e.replies).map(Number);
      expect(statuses, e.path).toEqual(expect.arrayContaining([429, 500, 503]));
      if (!e.public) expect(statuses, e.path).toEqual(expect.arrayContaining([401, 404]));
      expect(
        statuses.filter((s) => s >= 200 && s < 300),
        `${e.path}: one success`,
      ).toHaveLength(1);
      if (e.body) expect(statuses, `${e.method} ${e.path} takes a body`).toEqual(expect.arrayContaining([400, 413, 415]));
    }
  });

  it("finds the endpoint of a request by method and path, not by a longer or shorter path", () => {
    expect(endpointOf("GET", "/api/v1/designs/abc")).toBe(api.getDesign);
    expect(endpointOf("PUT", "/api/v1/designs/abc/draft")).toBe(api.saveDraft);
    expect(endpointOf("GET", "/api/v1/designs/abc/revisions/2/table.csv")).toBe(api.revisionTableCsv);
    expect(endpointOf("GET", "/api/v1/designs/abc/revisions/2/rows/7")).toBe(api.revisionRow);
    expect(endpointOf("DELETE", "/api/v1/designs/abc")).toBeUndefined();
    expect(endpointOf("GET", "/api/v1/designs/abc/nothing")).toBeUndefined();
  });
});

describe("the test-side check of answers", () => {
  const draft = { version: 3 };
  it("passes an answer of a declared status with its shape", async () => {
    expect(await checkAnswer("PUT", "/api/v1/designs/d1/draft", json(200, draft))).toBe("checked");
    expect(await checkAnswer("PUT", "/api/v1/designs/d1/draft", json(409, { ...error("stale_draft", "x"), currentVersion: 4 }))).toBe(
      "checked",
    );
    expect(await checkAnswer("GET", "/api/v1/docs", new Response("<html>"))).toBe("not-an-endpoint");
  });

  it("refuses a status the endpoint does not declare", async () => {
    await expect(checkAnswer("PUT", "/api/v1/designs/d1/draft", json(201, draft))).rejects.toBeInstanceOf(AnswerMismatch);
    await expect(checkAnswer("GET", "/api/v1/designs/d1", json(422, error("x", "y")))).rejects.toThrow(/does not declare/);
  });

  it("refuses a body of the wrong shape, a missing field or a body that is not JSON", async () => {
    await expect(checkAnswer("PUT", "/api/v1/designs/d1/draft", json(200, { version: "3" }))).rejects.toThrow(/does not match/);
    await expect(checkAnswer("PUT", "/api/v1/designs/d1/draft", json(409, error("stale_draft", "x")))).rejects.toThrow(/currentVersion/);
    // A 409 is stale_draft with currentVersion or design_archived with archived: with neither, both are named.
    await expect(checkAnswer("PUT", "/api/v1/designs/d1/draft", json(409, error("stale_draft", "x")))).rejects.toThrow(/archived/);
    const archived = { ...error("design_archived", "x"), archived: { at: "2026-12-02T10:00:00.000Z", by: { id: "u", name: "Rhea" } } };
    expect(await checkAnswer("PUT", "/api/v1/designs/d1/draft", json(409, archived))).toBe("checked");
    await expect(checkAnswer("GET", "/api/v1/designs/d1", new Response("<html>oops</html>", { status: 404 }))).rejects.toThrow(/not JSON/);
    const run = { runs: [{ id: "r", status: "paused" }], nextCursor: null };
    await expect(checkAnswer("GET", "/api/v1/bench-runs", json(200, run))).rejects.toThrow(/does not match/);
  });

  it("allows only 405, 429 or 503 in the error shape for a method no endpoint serves", async () => {
    expect(await checkAnswer("DELETE", "/api/v1/designs/d1", json(405, error("method_not_allowed", "Use GET")))).toBe("checked");
    await expect(checkAnswer("DELETE", "/api/v1/designs/d1", json(200, {}))).rejects.toBeInstanceOf(AnswerMismatch);
    await expect(checkAnswer("DELETE", "/api/v1/designs/d1", json(405, { message: "no" }))).rejects.toBeInstanceOf(AnswerMismatch);
  });

  it("checks the CSV answer's content type", async () => {
    const csv = (type: string) => new Response("a,b\n", { status: 200, headers: { "content-type": type } });
    expect(await checkAnswer("GET", "/api/v1/designs/d/revisions/1/table.csv", csv("text/csv; charset=utf-8"))).toBe("checked");
    await expect(checkAnswer("GET", "/api/v1/designs/d/revisions/1/table.csv", csv("application/json"))).rejects.toThrow(/text\/csv/);
  });
});

describe("the browser client", () => {
  it("fills path parameters (encoded) and the query", () => {
    expect(apiUrl(api.recordStep, { runId: "a/b", n: 3 })).toBe("/api/v1/bench-runs/a%2Fb/steps/3");
    expect(apiUrl(api.reviewInbox, undefined, { workspace: "larkspur" })).toBe("/api/v1/reviews?workspace=larkspur");
    expect(apiUrl(api.revisionRows, { designId: "d", number: 2 }, { where: ["seat:empty", "key:on"], from: 0, rule: undefined })).toBe(
      "/api/v1/designs/d/revisions/2/rows?where=seat%3Aempty&where=key%3Aon&from=0",
    );
  });

  it("reads a declared answer with its schema and refuses an undeclared one with the API's message", async () => {
    const saved = await readAnswer(api.saveDraft, json(409, { ...error("stale_draft", "Saved elsewhere."), currentVersion: 7 }));
    expect(saved).toEqual({ status: 409, body: { ...error("stale_draft", "Saved elsewhere."), currentVersion: 7 } });
    const teapot = readAnswer(api.saveDraft, json(418, error("teapot", "No coffee here.")));
    await expect(teapot).rejects.toBeInstanceOf(ApiError);
    await expect(readAnswer(api.saveDraft, json(418, error("teapot", "No coffee here.")))).rejects.toThrow("No coffee here.");
    await expect(readAnswer(api.saveDraft, json(200, { version: "seven" }))).rejects.toMatchObject({
      status: 200,
      code: "unexpected_answer",
    });
  });
});
