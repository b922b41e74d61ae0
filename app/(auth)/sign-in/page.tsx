import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getActor } from "@/lib/auth/session";
import { safePath } from "@/lib/domain/safe-path";
import { SIGN_IN_REASONS, readSignInReason } from "@/lib/domain/schemas/sign-in";
import { Notice } from "@/components/ui/notice";
import { SignInForm } from "./_components/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  "password-reset": "Your password has been changed. Sign in with the new one.",
  "signed-out": "You have signed out.",
};

export default async function SignInPage({ searchParams }: PageProps<"/sign-in">) {
  const params = await searchParams;
  const wanted = safePath(typeof params.next === "string" ? params.next : null);
  const next = wanted === "/sign-in" || wanted.startsWith("/sign-in?") ? "/home" : wanted;
  // Someone already signed in has nothing to do here.
  if (await getActor()) redirect(next);
  const noticeKey = typeof params.notice === "string" ? params.notice : undefined;
  // Why a session ended (lib/auth/session.ts sends it): one of a fixed list, each with its own words.
  const reason = readSignInReason(params.reason);

  if (reason) {
    const { title, message } = SIGN_IN_REASONS[reason];
    return (
      <>
        <h1 className="text-2xl font-semibold tracking-tight text-ink-950">{title}</h1>
        <div className="mt-4 mb-8">
          <Notice tone={reason === "deactivated" ? "warn" : "info"} testId="sign-in-reason">
            <span data-reason={reason}>{message}</span>
          </Notice>
        </div>
        <p className="mb-5 text-sm text-ink-700">
          {reason === "deactivated" ? "To use Gusset with another account, sign in here." : "Sign in again to carry on."}
        </p>
        <SignInForm next={next} />
      </>
    );
  }

  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight text-ink-950">Sign in</h1>
      <p className="mt-2 mb-8 text-sm text-ink-700">Use the e-mail your firm&apos;s admin invited you with.</p>
      <SignInForm next={next} notice={noticeKey ? NOTICES[noticeKey] : undefined} />
    </>
  );
}
