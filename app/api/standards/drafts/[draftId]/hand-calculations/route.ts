// POST a hand calculation (multipart form, field `file`: PDF, PNG or JPEG, up to 10 MB) to the standard of a
// draft its author is editing. Answers `{ data: { sha256, fileName, contentType, bytes, added, slug } }`: the
// sha256 is what a verification case's `hand_calculation` cites. A body announced as larger than the limit is
// refused before it is read.
import { HAND_CALCULATION_MAX_BYTES } from "@/lib/domain/schemas/standards";
import { routeHandler } from "@/lib/use-cases/next";
import { attachHandCalculation } from "@/lib/use-cases/standard-attachments";
import { jsonResponse } from "@/lib/domain/json-response";

const attach = routeHandler(attachHandCalculation);
/** The file plus the form's own framing. */
const BODY_LIMIT = HAND_CALCULATION_MAX_BYTES + 64 * 1024;

export async function POST(request: Request, context: { params: Promise<Record<string, string>> }): Promise<Response> {
  if (Number(request.headers.get("content-length") ?? 0) > BODY_LIMIT)
    return jsonResponse(
      {
        error: {
          code: "invalid-input",
          message: "That file is over 10 MB; scan it at a lower resolution or split it.",
          fieldErrors: { file: ["That file is over 10 MB; scan it at a lower resolution or split it."] },
        },
      },
      { status: 422 },
    );
  return attach(request, context);
}
