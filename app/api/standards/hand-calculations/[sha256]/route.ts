// GET an attached hand calculation by its sha256, as a download, for anyone who reads the firm's standards.
import { attachmentDisposition } from "@/lib/domain/file-signatures";
import { routeHandler } from "@/lib/use-cases/next";
import { readHandCalculation } from "@/lib/use-cases/standard-attachments";

export const GET = routeHandler(readHandCalculation, {
  respond: ({ body, contentType, fileName, sha256 }) =>
    new Response(Buffer.from(body), {
      headers: {
        "Content-Type": contentType,
        "Content-Length": String(body.length),
        "Content-Disposition": attachmentDisposition(fileName),
        "Cache-Control": "private, no-store",
        "X-Content-SHA256": sha256,
      },
    }),
});
