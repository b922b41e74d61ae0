// Per-test time limits for journeys that sign in. The server allows a few sign-in attempts a minute
// from one address (lib/auth/server.ts), and the whole suite signs in from 127.0.0.1, so any journey
// may have to wait out that minute once or twice.
export const SIGN_IN_MINUTE_MS = 61_000;

/** A journey with `signIns` sign-ins, allowing each a wait for the limiter, plus the work itself. */
export function journeyTimeout(signIns: number, workMs = 60_000): number {
  return workMs + signIns * (SIGN_IN_MINUTE_MS + 5_000);
}
