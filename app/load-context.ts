// What our HTTP server (scripts/serve.ts) hands to every request: with route middleware on
// (future.v8_middleware, decision 151) that is a RouterContextProvider, read through typed contexts.
import { createContext, type RouterContext } from "react-router";

// The server script imports this module from source and the built app bundles its own copy: both
// must hold the very same context object, so it is kept under a global symbol.
const KEY = Symbol.for("chainproof.csp-nonce-context");
const registry = globalThis as { [KEY]?: RouterContext<string | undefined> };

/** A fresh nonce per request for the Content-Security-Policy; absent under the Vite dev server. */
export const cspNonceContext: RouterContext<string | undefined> = (registry[KEY] ??= createContext<string | undefined>(undefined));
