import { describe, expect, it } from "vitest";
import { canonicalJson } from "~/lib/canonical-json";
import { contentHash } from "./content-hash.server";

describe("canonical JSON and content hash", () => {
  it("matches the canonical form of the RFC 8785 example (section 3.2.4; example recalled from memory)", () => {
    const input = JSON.parse(
      String.raw`{"numbers":[333333333.33333329,1E30,4.50,2e-3,0.000000000000000000000000001],"string":"\u20ac$\u000F\u000aA'\u0042\u0022\u005c\\\"\/","literals":[null,true,false]}`,
    );
    expect(canonicalJson(input)).toBe(
      String.raw`{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],"string":"€$\u000f\nA'B\"\\\\\"/"}`,
    );
  });

  it("sorts keys by UTF-16 code units at every depth and ignores formatting", () => {
    const a = JSON.parse('{ "b": 1, "a": { "z": [ {"y": 2, "x": 1} ], "\u00e9": 0, "Z": 0 } }');
    expect(canonicalJson(a)).toBe('{"a":{"Z":0,"z":[{"x":1,"y":2}],"é":0},"b":1}');
  });

  it("is SHA-256 of the canonical text (value from coreutils sha256sum of the same bytes)", () => {
    // printf '%s' '{"a":[true,null],"b":1}' | sha256sum
    expect(contentHash({ b: 1, a: [true, null] })).toBe("51705a2c9eb3e7e410a58f696a770c3ac3885a0cf43eb7fc88f5e47c11d4d30d");
  });

  it("refuses values JSON cannot carry", () => {
    expect(() => canonicalJson({ n: Number.NaN })).toThrow(TypeError);
    expect(() => canonicalJson({ f: () => 1 })).toThrow(TypeError);
  });
});
