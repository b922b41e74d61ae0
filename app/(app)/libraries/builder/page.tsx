import type { Metadata } from "next";
import Link from "next/link";
import { requirePageActor } from "@/lib/auth/session";
import { PageHeader } from "@/components/ui/page-header";
import { SectionBuilder } from "@/components/libraries/section-builder";

export const metadata: Metadata = { title: "Section builder" };

// Anyone who reads the libraries may work a section out here; nothing is kept. A lead adds a section to
// the firm's library from a library draft, where the same builder saves it.
export default async function SectionBuilderPage() {
  await requirePageActor("libraries.read", { next: "/libraries/builder" });
  return (
    <>
      <PageHeader
        title="Section builder"
        lead="Type a section's dimensions in millimetres: its drawing, to scale, and its properties are worked out as you type. Nothing here is saved."
        actions={
          <Link href="/libraries" className="text-sm font-medium text-plate-800 hover:underline">
            Back to the libraries
          </Link>
        }
      />
      <SectionBuilder />
    </>
  );
}
