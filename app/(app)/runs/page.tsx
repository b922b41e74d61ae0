import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata: Metadata = { title: "Runs" };

export default async function RunsPage() {
  await requirePageActor("runs.read", { next: "/runs" });
  return (
    <>
      <PageHeader
        title="Runs"
        lead="Every run of a published version: the inputs given, the frame engine's results, the checks with their utilisations, and the calc sheet with its sign-off."
      />
      <EmptyState
        title="No runs yet"
        items={[
          "Runs by job, with the standard's version and the engine version that produced them.",
          "Calc sheets waiting to be checked or approved.",
          "Runs affected by a withdrawn version, and their re-runs on the corrected one.",
        ]}
      >
        Running a published version inside a job is coming once the firm has its first standards. Each run is stored for good, so
        that any number on a drawing can be traced back to it.
      </EmptyState>
    </>
  );
}
