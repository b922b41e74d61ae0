import { routeHandler } from "@/lib/use-cases/next";
import { readConsistencyProof } from "@/lib/use-cases/log";

// GET /api/log/consistency?from=<size>&to=<size>: both signed heads and the RFC 9162 consistency proof that the
// later one extends the earlier (nothing sealed under the first was changed or dropped).
export const GET = routeHandler(readConsistencyProof);
