import { testEnv } from "../env";

/**
 * Whether the served app runs with the fake SMTP server (and so shows the admin's demo mailbox). The
 * start scripts give the app and the tests the same FAKE_MAIL_API_URL, so "its API answers" is the
 * same signal the app reads.
 */
export async function isFakeMailInUse(): Promise<boolean> {
  try {
    const response = await fetch(new URL("/health", testEnv.mailApiUrl), { signal: AbortSignal.timeout(2_000) });
    return response.ok;
  } catch {
    return false;
  }
}
