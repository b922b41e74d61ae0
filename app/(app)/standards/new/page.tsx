import type { Metadata } from "next";
import { requirePageActor } from "@/lib/auth/session";
import { PageHeader } from "@/components/ui/page-header";
import { NewStandardForm } from "./new-standard-form";

export const metadata: Metadata = { title: "New standard" };

export default async function NewStandardPage() {
  await requirePageActor("templates.write-draft", { next: "/standards/new" });
  return (
    <>
      <PageHeader
        title="New standard"
        lead="A new standard starts as a draft with a small working example (a simply supported beam checked in bending) to edit into your own."
      />
      <NewStandardForm />
    </>
  );
}
