// POST a hand calculation (multipart form, field `file`: PDF, PNG or JPEG, up to 10 MB) to the standard of a
// draft its author is editing. Answers `{ data: { sha256, fileName, contentType, bytes, added, slug } }`: the
// sha256 is what a verification case's `hand_calculation` cites.
import { routeHandler } from "@/lib/use-cases/next";
import { attachHandCalculation } from "@/lib/use-cases/standard-attachments";

export const POST = routeHandler(attachHandCalculation);
