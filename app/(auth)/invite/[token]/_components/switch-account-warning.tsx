"use client";

import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { authClient } from "@/lib/auth/client";
import { Button, buttonClasses } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";

// An invitation opened in a browser where someone is signed in (an admin trying the demo mailbox's
// link, a shared computer): accepting it would sign that person out, so ask first. Signing out ends
// that session properly; the page then shows the invitation's form.
export function SwitchAccountWarning({ signedInAs }: { signedInAs: string }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function signOutAndContinue() {
    setPending(true);
    setError(null);
    const { error: failure } = await authClient.signOut();
    if (failure) {
      setPending(false);
      setError("Could not sign you out. Try again.");
      return;
    }
    router.refresh();
  }

  return (
    <div className="space-y-5" data-testid="switch-account-warning">
      <Notice tone="warn" title="You are signed in as someone else">
        You are signed in as <strong data-testid="signed-in-as">{signedInAs}</strong>. Accepting this invitation signs you out of
        that account.
      </Notice>
      <FormError message={error} />
      <div className="flex flex-col gap-3 sm:flex-row">
        <Button
          type="button"
          onClick={signOutAndContinue}
          pending={pending}
          pendingLabel="Signing out…"
          data-testid="switch-account"
        >
          Sign out and continue
        </Button>
        <Link href="/home" className={buttonClasses("secondary")} data-testid="stay-signed-in">
          Stay signed in, back to Gusset
        </Link>
      </div>
    </div>
  );
}
