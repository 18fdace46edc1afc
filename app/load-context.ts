// What our HTTP server (scripts/serve.ts) hands to every loader, action and the server entry.
declare module "react-router" {
  interface AppLoadContext {
    /** A fresh nonce per request for the Content-Security-Policy; absent under the Vite dev server. */
    cspNonce?: string;
  }
}
export {};
