import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { PageHeader } from "@/components/ui/page-header";
import { NewLibraryForm } from "./new-library-form";

export const metadata: Metadata = { title: "New library" };

export default async function NewLibraryPage() {
  await requirePageActor("libraries.write-draft", { next: "/libraries/new" });
  return (
    <>
      <PageHeader
        title="New library"
        lead="A new library starts as an empty draft of the kind you choose. Add its entries, save, and submit it: a second admin or standards lead reviews it before it is published as version 1."
        actions={
          <Link href="/libraries" className="text-sm font-medium text-plate-800 hover:underline">
            Back to the libraries
          </Link>
        }
      />
      <NewLibraryForm />
    </>
  );
}
