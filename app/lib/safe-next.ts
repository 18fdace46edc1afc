// Where to go after signing in or up: a path of this site, or "/". Browsers drop tab and newline
// from a URL and read "\" as "/" (WHATWG URL Standard, "URL parsing"), so "/\t/evil.example/"
// would land on another origin; such values, and anything but a plain same-origin path, go home.

const BASE = "http://next.invalid";
// Control characters (C0, DEL, C1), every kind of space and separator, and backslashes.
// eslint-disable-next-line no-control-regex -- finding control characters is what this pattern is for
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\s\\]/u;

/** A same-origin path to redirect to, written in printable ASCII (so it fits a Location header); else "/". */
export function safeNext(value: string | null | undefined): string {
  if (!value || !value.startsWith("/") || value.startsWith("//") || UNSAFE.test(value)) return "/";
  let url: URL;
  try {
    url = new URL(value, BASE);
  } catch {
    return "/";
  }
  // The parser percent-encodes what is beyond ASCII and resolves dot segments ("/.//x" is "//x").
  const path = url.pathname + url.search + url.hash;
  if (url.origin !== BASE || !path.startsWith("/") || path.startsWith("//") || !/^[\x21-\x7e]+$/.test(path)) return "/";
  return path;
}
