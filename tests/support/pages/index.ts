export { AppShell } from "./app-shell";
export { InvitationPage } from "./invitation-page";
export { ForgotPasswordPage, ResetPasswordPage } from "./password-pages";
export { PeoplePage } from "./people-page";
export { SignInPage } from "./sign-in-page";
export * from "./sessions";
export * from "./timeouts";
export * from "./fake-mail";
export * from "./journeys";
