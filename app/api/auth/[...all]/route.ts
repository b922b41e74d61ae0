// better-auth's own endpoints (sign-in, sign-out, password reset, session). The one route that does
// not run as one of our use cases (lib/use-cases): better-auth protects it (sign-up disabled, rate limits, origin
// check), and lib/auth/server.ts audits sign-ins, failed sign-ins and resets. While the database cannot
// be reached it answers 503 `unavailable` like the rest of the API (answerOutages).
import { handleAuthRequest } from "@/lib/auth/server";
import { answerOutages } from "@/lib/use-cases/next";

export const GET = answerOutages(handleAuthRequest);
export const POST = answerOutages(handleAuthRequest);
