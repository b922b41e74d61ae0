import type { Metadata } from "next";
import { getActor } from "@/lib/auth/session";
import { ROLE_LABELS } from "@/lib/domain/roles";
import { StatusPage } from "@/components/status-page";

export const metadata: Metadata = { title: "Not available to your role" };

// Rendered by forbidden() with status 403 when a signed-in person opens a page their role does not cover.
export default async function Forbidden() {
  const actor = await getActor();
  return (
    <StatusPage code="403" title="This page is not part of your role" testId="forbidden-page">
      <p>
        {actor ? (
          <>
            You are signed in as <strong>{actor.name}</strong> with the role{" "}
            <strong data-testid="forbidden-role">{ROLE_LABELS[actor.role]}</strong>, which does not include this page.
          </>
        ) : (
          <>Your role does not include this page.</>
        )}{" "}
        Nothing was changed.
      </p>
      <p>
        If your work needs it, ask your firm&apos;s Gusset admin to review your role. Roles decide what each person may see and
        change, so that every record stays defensible.
      </p>
    </StatusPage>
  );
}
