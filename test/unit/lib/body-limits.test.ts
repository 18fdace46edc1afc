// Which page bodies are refused before they are read (app/lib/body-limits.ts). The running server's
// answers are checked in test/integration/hardening.test.ts.
import { describe, expect, it } from "vitest";
import { MAX_UPLOAD_BYTES, PAGE_FORM_MAX_BYTES, pageBodyRefusal } from "~/lib/body-limits";

const post = (over: Partial<Parameters<typeof pageBodyRefusal>[0]>) =>
  pageBodyRefusal({
    method: "POST",
    path: "/w/larkspur/vehicles",
    contentType: "application/x-www-form-urlencoded",
    contentLength: "100",
    transferEncoding: undefined,
    ...over,
  });

describe("page body limits", () => {
  it("reads a form up to its limit and refuses one byte more", () => {
    expect(post({ contentLength: String(PAGE_FORM_MAX_BYTES) })).toBeNull();
    expect(post({ contentLength: String(PAGE_FORM_MAX_BYTES + 1) })).toMatchObject({ status: 413 });
  });

  it("lets a photo upload through up to the upload limit, not beyond it and its form", () => {
    const multipart = "multipart/form-data; boundary=x";
    expect(post({ contentType: multipart, contentLength: String(MAX_UPLOAD_BYTES + 64 * 1024) })).toBeNull();
    expect(post({ contentType: multipart, contentLength: String(MAX_UPLOAD_BYTES + 2 * 1024 * 1024) })).toMatchObject({
      status: 413,
      message: expect.stringContaining("An upload is at most 20 MB"),
    });
  });

  it("refuses a body sent without its length, or with a length that is not a number", () => {
    expect(post({ contentLength: undefined, transferEncoding: "chunked" })).toMatchObject({ status: 411 });
    expect(post({ contentLength: "12abc" })).toMatchObject({ status: 411 });
    expect(post({ contentLength: "-1" })).toMatchObject({ status: 411 });
  });

  it("leaves reads and the API (which has limits of its own) alone", () => {
    expect(post({ method: "GET", contentLength: undefined, transferEncoding: "chunked" })).toBeNull();
    expect(post({ path: "/api/v1/proofs", contentLength: String(10 * PAGE_FORM_MAX_BYTES) })).toBeNull();
    expect(post({ path: "/api/auth/sign-in/email", contentLength: undefined, transferEncoding: "chunked" })).toBeNull();
    // A page whose name only starts like the API's is a page.
    expect(post({ path: "/apiary", contentLength: String(PAGE_FORM_MAX_BYTES + 1) })).toMatchObject({ status: 413 });
  });

  it("a POST with no body at all (no length, no transfer encoding) is read as empty", () => {
    expect(post({ contentLength: undefined })).toBeNull();
  });
});
