import type { Metadata } from "next";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import { OUTAGE_REQUEST_HEADER } from "@/lib/domain/outage";
import { StatusPage } from "@/components/status-page";
import { buttonClasses } from "@/components/ui/button";

export const metadata: Metadata = { title: "Cannot reach the database" };

// Shown, with 503, in place of any page asked for while the database cannot be reached: proxy.ts rewrites
// the request here and names the page asked for in a request header. Reads nothing from the database.
// Asked for directly (the proxy drops that header from every request), there is nothing here: 404.
export default async function Unavailable() {
  const askedFor = (await headers()).get(OUTAGE_REQUEST_HEADER);
  if (!askedFor) notFound();
  // The proxy wrote it from the request's own path; still, only a same-site path becomes the link.
  const retry = askedFor.startsWith("/") && !askedFor.startsWith("//") && !askedFor.startsWith("/\\") ? askedFor : "/home";
  return (
    <StatusPage
      code="503"
      title="Gusset is unavailable for a moment"
      testId="unavailable-page"
      action={
        // A full page load, not a client navigation: the proxy checks the database again.
        <a href={retry} className={buttonClasses("primary")} data-testid="unavailable-retry">
          Try again
        </a>
      }
    >
      <p data-testid="unavailable-message">Gusset cannot reach its database; try again in a minute.</p>
      <p>Nothing was changed by opening this page. If it lasts more than a few minutes, tell your firm&apos;s Gusset admin.</p>
    </StatusPage>
  );
}
