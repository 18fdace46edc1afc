// Live proof off the main thread: validate, compile and prove the design the editor posts.
import { proveHere, type ProofRequest } from "./proof-protocol";

self.onmessage = (event: MessageEvent<ProofRequest>) => {
  (self as unknown as Worker).postMessage(proveHere(event.data));
};
