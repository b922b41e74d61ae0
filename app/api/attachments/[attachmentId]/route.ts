// GET an attachment of a job or run, as a download, for anyone who may read jobs. X-Content-SHA256 is its sha256,
// checked against the stored bytes before they are sent.
import { attachmentResponse } from "@/lib/use-cases/file-responses";
import { readAttachment } from "@/lib/use-cases/files";
import { routeHandler } from "@/lib/use-cases/next";

export const GET = routeHandler(readAttachment, { respond: attachmentResponse });
