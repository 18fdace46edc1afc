// A worker thread of the proof pool: validates and proves one design document off the request thread.
import { proveDocument } from "../designs/proof";

export default function proveInWorker(document: unknown) {
  return proveDocument(document);
}
