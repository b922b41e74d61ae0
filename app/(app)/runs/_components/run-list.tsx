"use client";
// A list of runs that grows in place: the first page comes with the page (rendered on the server), older pages are
// fetched from GET /api/runs with TanStack Query as the reader asks for them (kept in its cache, so going back to
// the list does not fetch them again). Without JavaScript, "Older runs" is a plain link to the next page.
import Link from "next/link";
import { QueryClient, QueryClientProvider, useInfiniteQuery } from "@tanstack/react-query";
import { useState } from "react";
import type { RunSummaryDto } from "@/lib/data/runs";
import { FormError } from "@/components/ui/notice";
import { RunTable } from "./run-table";

type RunPage = { runs: RunSummaryDto[]; nextCursor: string | null };
type Filter = Record<string, string | undefined>;

/** The filter and cursor as a query string, leaving out what is not set. */
const queryOf = (filter: Filter, cursor: string | undefined) =>
  new URLSearchParams(Object.entries({ ...filter, cursor }).filter(([, v]) => v) as [string, string][]);

async function fetchRuns(filter: Filter, cursor: string): Promise<RunPage> {
  const response = await fetch(`/api/runs?${queryOf(filter, cursor)}`, { headers: { accept: "application/json" } });
  const answer = (await response.json().catch(() => null)) as { data?: RunPage; error?: { message: string } } | null;
  if (!response.ok || !answer?.data) throw new Error(answer?.error?.message ?? "The older runs could not be loaded; try again.");
  return answer.data;
}

function Runs({ first, filter, showJob }: { first: RunPage; filter: Filter; showJob: boolean }) {
  const query = useInfiniteQuery({
    queryKey: ["runs", filter],
    queryFn: ({ pageParam }) => fetchRuns(filter, pageParam),
    initialPageParam: "",
    initialData: { pages: [first], pageParams: [""] },
    getNextPageParam: (page) => page.nextCursor ?? undefined,
    staleTime: 60_000,
  });
  const pages = query.data?.pages ?? [first];
  const next = pages.at(-1)?.nextCursor ?? null;
  const href = `/runs?${queryOf(filter, next ?? undefined)}`;
  return (
    <>
      <RunTable runs={pages.flatMap((page) => page.runs)} showJob={showJob} />
      {query.error ? <FormError message={query.error.message} /> : null}
      {next ? (
        <p className="mt-3 text-sm">
          <Link
            href={href}
            className="text-plate-700 hover:underline"
            data-testid="runs-next"
            aria-busy={query.isFetchingNextPage}
            onClick={(event) => {
              event.preventDefault();
              if (!query.isFetchingNextPage) void query.fetchNextPage();
            }}
          >
            {query.isFetchingNextPage ? "Loading older runs…" : "Older runs"}
          </Link>
        </p>
      ) : null}
    </>
  );
}

export function RunList({ first, filter, showJob = true }: { first: RunPage; filter: Filter; showJob?: boolean }) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: 1, refetchOnWindowFocus: false } } }));
  return (
    <QueryClientProvider client={client}>
      <Runs first={first} filter={filter} showJob={showJob} />
    </QueryClientProvider>
  );
}
