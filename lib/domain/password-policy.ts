// The password rules, in one place: better-auth's limits, the invitation and reset forms, and the
// server all read these.
import { plainText } from "./schemas/text";

export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 128;

export const newPasswordField = plainText("Passwords cannot hold control characters. Use letters, digits, spaces and symbols.")
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`);
