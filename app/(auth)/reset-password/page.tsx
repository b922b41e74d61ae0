import type { Metadata } from "next";
import { TextLink } from "@/components/ui/text-link";
import { Notice } from "@/components/ui/notice";
import { ResetPasswordForm } from "./_components/reset-password-form";

export const metadata: Metadata = { title: "Choose a new password" };

// Reached from the e-mailed link (/reset-password?token=…), or through better-auth's redirect endpoint,
// which adds ?error=INVALID_TOKEN when the token is unknown or expired. A used token is only found out
// when the form is sent; the server's answer is shown then.
export default async function ResetPasswordPage({ searchParams }: PageProps<"/reset-password">) {
  const params = await searchParams;
  const token = typeof params.token === "string" ? params.token : "";
  const invalid = params.error !== undefined || token === "";

  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight text-ink-950">Choose a new password</h1>
      {invalid ? (
        <div className="mt-8 space-y-5" data-testid="reset-link-invalid">
          <Notice tone="fault" title="This link cannot be used">
            It has expired, has already been used, or was copied incompletely. Reset links work once and for one hour.
          </Notice>
          <p className="text-sm">
            <TextLink href="/forgot-password">Ask for a new link</TextLink>
          </p>
        </div>
      ) : (
        <>
          <p className="mt-2 mb-8 text-sm text-ink-500">Changing your password signs you out on every other device.</p>
          <ResetPasswordForm token={token} />
        </>
      )}
    </>
  );
}
