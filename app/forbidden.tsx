import type { Metadata } from "next";
import { getActor, getRefusedAction } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { ROLES, ROLE_LABELS } from "@/lib/domain/roles";
import { StatusPage } from "@/components/status-page";

export const metadata: Metadata = { title: "Not available to your role" };

/** "the Admin role", "the Admin and QA auditor roles", "the Standards lead, Engineer and QA auditor roles". */
function rolesPhrase(labels: string[]): string {
  if (labels.length === 1) return `the ${labels[0]} role`;
  return `the ${labels.slice(0, -1).join(", ")} and ${labels[labels.length - 1]} roles`;
}

// Rendered by forbidden() with status 403 when a signed-in person opens a page their role does not cover.
// It reads the role afresh for this request, so after a role change it names the new one.
export default async function Forbidden() {
  const actor = await getActor();
  const action = getRefusedAction();
  const forRoles = action ? ROLES.filter((role) => can(role, action)).map((role) => ROLE_LABELS[role]) : [];
  return (
    <StatusPage code="403" title="This page is not part of your role" testId="forbidden-page">
      <p>
        {actor ? (
          <>
            You are signed in as <strong data-testid="forbidden-name">{actor.name}</strong>,{" "}
            <strong data-testid="forbidden-role">{ROLE_LABELS[actor.role]}</strong>.{" "}
          </>
        ) : null}
        {forRoles.length > 0 ? (
          <span data-testid="forbidden-for">This page is for {rolesPhrase(forRoles)}.</span>
        ) : (
          <>Your role does not include this page.</>
        )}{" "}
        Nothing was changed.
      </p>
      <p>
        If your work needs it, ask an administrator of your firm to review your role. Roles decide what each person may see and
        change, so that every record stays defensible.
      </p>
    </StatusPage>
  );
}
