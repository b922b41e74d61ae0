import { routeHandler } from "@/lib/use-cases/next";
import { readInclusionProof } from "@/lib/use-cases/log";

// GET /api/log/inclusion?kind=run&ref=<id>[&size=<tree size>]: the record's leaf (its entry, hash and index) and its
// RFC 9162 inclusion proof to the given signed head, or to the first head that holds it; { sealed: false } while the
// sealer has not reached it yet.
export const GET = routeHandler(readInclusionProof);
