// The way to the run log from the audit trail and the runs list, for the roles that read it.
import Link from "next/link";
import type { Actor } from "@/lib/domain/actor";
import { can } from "@/lib/domain/permissions";
import { buttonClasses } from "@/components/ui/button";

export function RunLogLink({ actor, testId }: { actor: Actor; testId: string }) {
  if (!can(actor.role, "run-log.read")) return null;
  return (
    <Link href="/audit/runs" className={buttonClasses("secondary")} data-testid={testId}>
      Run log
    </Link>
  );
}
