import type { Metadata } from "next";
import { getActor } from "@/lib/auth/session";
import { ROLE_LABELS, ROLE_SUMMARIES } from "@/lib/domain/roles";
import { INVITATION_MESSAGES } from "@/lib/domain/schemas/invitations";
import { runUseCase } from "@/lib/use-cases/run";
import { lookupInvitation } from "@/lib/use-cases/invitations";
import { Notice } from "@/components/ui/notice";
import { TextLink } from "@/components/ui/text-link";
import { AcceptInvitationForm } from "./_components/accept-invitation-form";
import { SwitchAccountWarning } from "./_components/switch-account-warning";

export const metadata: Metadata = { title: "Accept your invitation" };

export default async function InvitationPage({ params }: PageProps<"/invite/[token]">) {
  const { token } = await params;
  const invitation = await runUseCase(lookupInvitation, { actor: null, input: { token } });
  const signedIn = await getActor();

  if (!invitation || invitation.status !== "valid") {
    const status = invitation?.status ?? "unknown";
    return (
      <div data-testid="invitation-unusable" data-status={status}>
        <h1 className="text-2xl font-semibold tracking-tight text-ink-950">This invitation cannot be used</h1>
        <div className="mt-6">
          <Notice tone="fault" testId="invitation-message">
            {INVITATION_MESSAGES[status as keyof typeof INVITATION_MESSAGES]}
          </Notice>
        </div>
        <p className="mt-6 text-sm">
          <TextLink href="/sign-in">Go to sign in</TextLink>
        </p>
      </div>
    );
  }

  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight text-ink-950">Welcome to Gusset, {invitation.name.split(" ")[0]}</h1>
      <dl
        className="mt-6 mb-8 space-y-3 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200"
        data-testid="invitation-details"
      >
        <div>
          <dt className="text-xs text-ink-700">Invited</dt>
          <dd className="font-medium text-ink-900" data-testid="invitation-name">
            {invitation.name} · <span className="font-normal text-ink-700">{invitation.email}</span>
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-700">As</dt>
          <dd className="font-medium text-plate-800" data-testid="invitation-role">
            {ROLE_LABELS[invitation.role]}
          </dd>
          <dd className="text-ink-500">{ROLE_SUMMARIES[invitation.role]}</dd>
        </div>
      </dl>
      {signedIn ? (
        // Accepting signs the new person in: the session of whoever is signed in here now would end unasked.
        <SwitchAccountWarning signedInAs={signedIn.name} />
      ) : (
        <>
          <p className="mb-5 text-sm text-ink-700">Choose a password. You will sign in with it and your e-mail from now on.</p>
          <AcceptInvitationForm token={token} />
        </>
      )}
    </>
  );
}
