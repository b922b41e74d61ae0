// Sentences the sign-in shows that both the server and the browser's auth client need. Kept apart from the zod
// schemas so that the auth client, on every signed-in page, does not carry zod into the page's first load.

/** What a locked account's sign-in is told (lib/auth/server.ts ACCOUNT_SIGN_IN_LIMIT), on the server and the page. */
export const ACCOUNT_LOCKED_MESSAGE =
  "Too many failed sign-ins for this e-mail address. Wait 15 minutes, or set a new password with “Forgot your password?”.";
