// better-auth's own endpoints (sign-in, sign-out, password reset, session). The one route that does
// not run as one of our use cases (lib/use-cases): better-auth protects it (sign-up disabled, rate limits, origin
// check), and lib/auth/server.ts audits sign-ins, failed sign-ins and resets.
import { handleAuthRequest } from "@/lib/auth/server";

export const GET = handleAuthRequest;
export const POST = handleAuthRequest;
