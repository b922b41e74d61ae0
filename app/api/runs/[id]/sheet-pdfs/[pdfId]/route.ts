// GET a calc sheet PDF kept for a run, by its id: the sheet as it was when that state was rendered.
import { sheetPdfResponse } from "@/lib/use-cases/file-responses";
import { readSheetPdf } from "@/lib/use-cases/files";
import { routeHandler } from "@/lib/use-cases/next";

export const GET = routeHandler(readSheetPdf, { respond: sheetPdfResponse });
