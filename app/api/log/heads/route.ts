// GET /api/log/heads: every tree head the log has signed, smallest first, as NDJSON (one JSON object a line: size,
// rootHash, sealedAt, signature, keyFingerprint, text, digest), streamed page by page so a log of millions of heads
// does not sit in the server's memory. Keep the file with the QA witness's e-mails: a later export must extend it.
// ?after=<size> starts after a head already kept.
import { getActorFromHeaders } from "@/lib/auth/session";
import { readTreeHeadsPage } from "@/lib/use-cases/log";
import { apiErrorResponse } from "@/lib/use-cases/next";
import { runUseCase } from "@/lib/use-cases/run";

const PAGE = 2000;

export async function GET(request: Request): Promise<Response> {
  const after = new URL(request.url).searchParams.get("after") ?? "0";
  let first;
  let actor;
  try {
    actor = await getActorFromHeaders(request.headers);
    first = await runUseCase(readTreeHeadsPage, { actor, input: { after, limit: PAGE } });
  } catch (error) {
    return apiErrorResponse(error); // 401, 403 or a bad ?after, before any byte is sent
  }
  const encoder = new TextEncoder();
  let page = first;
  const stream = new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (page.length === 0) return controller.close();
      controller.enqueue(encoder.encode(page.map((head) => `${JSON.stringify(head)}\n`).join("")));
      if (page.length < PAGE) {
        page = [];
        return;
      }
      try {
        page = await runUseCase(readTreeHeadsPage, { actor, input: { after: page[page.length - 1].size, limit: PAGE } });
      } catch (error) {
        controller.error(error);
      }
    },
  });
  return new Response(stream, {
    headers: {
      "Content-Type": "application/x-ndjson; charset=utf-8",
      "Content-Disposition": `attachment; filename="gusset-tree-heads-${new Date().toISOString().slice(0, 10)}.ndjson"`,
      "Cache-Control": "no-store",
    },
  });
}
