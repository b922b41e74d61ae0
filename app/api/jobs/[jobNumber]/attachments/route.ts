// POST a file to a job (multipart form: `file`, and optionally `runId` for one of the job's runs and `note`):
// PDF, PNG, JPEG or WebP up to 20 MB, its type told from its bytes. Answers
// `{ data: { id, added, jobNumber, runId, sha256, fileName, contentType, bytes } }`. A body announced as larger
// than the limit is refused before it is read.
import { ATTACHMENT_MAX_BYTES, ATTACHMENT_TOO_LARGE } from "@/lib/domain/schemas/jobs";
import { attachFile } from "@/lib/use-cases/files";
import { routeHandler } from "@/lib/use-cases/next";
import { jsonResponse } from "@/lib/domain/json-response";

const attach = routeHandler(attachFile);
/** The file plus the form's own framing and fields. */
const BODY_LIMIT = ATTACHMENT_MAX_BYTES + 64 * 1024;

export async function POST(request: Request, context: { params: Promise<Record<string, string>> }): Promise<Response> {
  if (Number(request.headers.get("content-length") ?? 0) > BODY_LIMIT)
    return jsonResponse(
      { error: { code: "invalid-input", message: ATTACHMENT_TOO_LARGE, fieldErrors: { file: [ATTACHMENT_TOO_LARGE] } } },
      { status: 422 },
    );
  return attach(request, context);
}
