// GET the PDF of a run's calc sheet as it shows now, rendered on the server by Chromium: the PDF kept for this
// state of the sheet, or a new one rendered, stored in S3 and kept (a new sign-off or a withdrawal banner makes
// a new state; the old PDFs stay, listed on the run's page). X-Content-SHA256 is the PDF's sha256.
import { sheetPdfResponse } from "@/lib/use-cases/file-responses";
import { renderSheetPdf, withRequestCookies } from "@/lib/use-cases/files";
import { routeHandler } from "@/lib/use-cases/next";

const render = routeHandler(renderSheetPdf, { respond: sheetPdfResponse });

export function GET(request: Request, context: { params: Promise<Record<string, string>> }): Promise<Response> {
  // The renderer opens the sheet page as the person asking, with their own session.
  return withRequestCookies(request.headers.get("cookie"), () => render(request, context));
}
