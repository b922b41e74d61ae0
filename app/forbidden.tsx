import type { Metadata } from "next";
import { getActor } from "@/lib/auth/session";
import { StatusPage } from "@/components/status-page";
import { ForbiddenDetail } from "./_components/forbidden-detail";

export const metadata: Metadata = { title: "Not available to your role" };

// Rendered by forbidden() with status 403 when a signed-in person opens a page their role does not cover.
// It names their current role and the roles the page is for (see ForbiddenDetail for why that part is
// filled in by the browser).
export default async function Forbidden() {
  const actor = await getActor();
  return (
    <StatusPage code="403" title="This page is not part of your role" testId="forbidden-page">
      <ForbiddenDetail drawnFor={actor ? { name: actor.name, role: actor.role } : null} />
      <p>
        If your work needs it, ask an administrator of your firm to review your role. Roles decide what each person may see and
        change, so that every record stays defensible.
      </p>
    </StatusPage>
  );
}
