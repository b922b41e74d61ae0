/** The size under which a JSON answer goes as it is: gzip's own framing and set-up cost more than they save. */
export const COMPRESS_FROM_BYTES = 1024;

/**
 * Response.json, marked `Cache-Control: no-transform` when the answer is small. Next compresses a route handler's
 * answer whenever the client accepts gzip: it drops the Content-Length a handler sets, so its compression cannot
 * see that an answer is under its threshold, and every 300-byte JSON answer went through a zlib stream set up and
 * torn down per request (about a tenth of the CPU of a signed-in GET /api/me). no-transform is the one signal it
 * honours per answer, and it says what is meant: nobody on the way needs to recode a few hundred bytes. Large answers
 * (run records, lists) are still compressed.
 */
export function jsonResponse(body: unknown, init: ResponseInit = {}): Response {
  const text = JSON.stringify(body);
  const headers = new Headers(init.headers);
  headers.set("content-type", "application/json");
  // UTF-8 takes at least a byte per UTF-16 unit, so a long text is large without encoding it (a run record's answer
  // is hundreds of kB): only a short one is measured.
  if (text.length < COMPRESS_FROM_BYTES && new TextEncoder().encode(text).byteLength < COMPRESS_FROM_BYTES) {
    const cacheControl = headers.get("cache-control");
    headers.set("cache-control", cacheControl ? `${cacheControl}, no-transform` : "no-transform");
  }
  return new Response(text, { ...init, headers });
}
