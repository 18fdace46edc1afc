// Reading a request body with a cap, and dropping what is left of a refused one, for every reader of
// bodies that must not hold one of any size (API JSON, better-auth's endpoints, photo uploads).

/**
 * Reads and throws away what is left of a refused body, up to `budget` bytes, so the client reads
 * our answer instead of a reset; a client that sends more than that is cut off.
 */
export async function drainBody(reader: ReadableStreamDefaultReader<Uint8Array>, budget: number): Promise<void> {
  let seen = 0;
  try {
    while (seen < budget) {
      const { done, value } = await reader.read();
      if (done) return;
      seen += value.byteLength;
    }
  } catch {
    // The client went away: nothing to answer.
  }
  await reader.cancel().catch(() => {});
}

/**
 * The whole body, at most `maxBytes`. Past that, what is still coming is drained (up to four times
 * the cap in all) and `tooLarge()` is thrown; a read that fails throws `interrupted(error)`.
 */
export async function readCapped(
  reader: ReadableStreamDefaultReader<Uint8Array>,
  maxBytes: number,
  tooLarge: () => unknown,
  interrupted: (error: unknown) => unknown = (error) => error,
): Promise<Uint8Array<ArrayBuffer>> {
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    let result: ReadableStreamReadResult<Uint8Array>;
    try {
      result = await reader.read();
    } catch (error) {
      throw interrupted(error);
    }
    if (result.done) break;
    total += result.value.byteLength;
    if (total > maxBytes) {
      await drainBody(reader, 4 * maxBytes - total);
      throw tooLarge();
    }
    chunks.push(result.value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}
