import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { can } from "@/lib/domain/permissions";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata: Metadata = { title: "Standards" };

export default async function StandardsPage() {
  const actor = await requirePageActor("library.read", { next: "/standards" });
  const writes = can(actor.role, "templates.write-draft");
  return (
    <>
      <PageHeader
        title="Standards"
        lead="The firm's standard calcs: each with its inputs, equations, model and checks, published as numbered versions that never change once issued."
      />
      <EmptyState
        title="No standards yet"
        items={[
          "Published versions, ready to run inside a job.",
          "Drafts and versions in review, with who is reviewing them.",
          "Superseded and withdrawn versions, kept so that every earlier run can still be traced.",
        ]}
      >
        {writes
          ? "Writing drafts and sending them for review is coming next. A second standards lead reviews each draft before it is published."
          : "Standards leads will publish standards here. Once a version is published you will be able to open it and run it inside a job."}
      </EmptyState>
    </>
  );
}
