// One published version of a standard, as a reader needs it: who wrote and approved it and when, its
// changelog and content hash, what it covers and does not, its inputs, the model drawn with its loads, the
// narrative with its equations worked at the default inputs, the checks, the verification cases with their
// results at publication, the library version each library reference reads (pinned at publication for
// `latest`), and the version history with links to each diff.
import { HandCalculationCitation } from "@/components/standards/hand-calculation";
import Link from "next/link";
import type { Actor } from "@/lib/domain/actor";
import { can } from "@/lib/domain/permissions";
import type { VersionDto, VersionSummaryDto } from "@/lib/data/standards";
import type { VersionView } from "@/lib/use-cases/standards";
import type { LibraryReferencePin } from "@/lib/use-cases/library-resolution";
import type { VersionWithdrawal } from "@/lib/use-cases/withdrawals";
import { compileStandard } from "@/lib/standards/compile";
import type { VerificationResult } from "@/lib/standards/verify";
import { formatSignificant, trimZeros } from "@/lib/standards/format";
import { NarrativeView } from "@/components/standards/narrative-view";
import { ModelDrawing } from "@/components/standards/model-drawing";
import { CheckLine } from "@/components/standards/check-line";
import { Caution } from "@/components/standards/caution";
import { PageHeader } from "@/components/ui/page-header";
import { TableFrame } from "@/components/ui/table";
import { Badge } from "@/components/ui/badge";
import { LocalTime } from "@/components/local-time";
import { VersionStatusBadge } from "./version-status";
import { StartDraftButton } from "./start-draft-button";
import { WithdrawForm } from "./withdraw-form";
import { Section } from "@/components/ui/section";

export function VersionView({
  version,
  history,
  actor,
  timeZone,
  withdrawal,
}: {
  version: VersionView;
  history: VersionSummaryDto[];
  actor: Actor;
  timeZone?: string;
  withdrawal: VersionWithdrawal | null;
}) {
  const compiled = compileStandard(version.source, version.libraries);
  const leads = can(actor.role, "templates.write-draft");
  const previous = history.find((v) => v.number === version.number - 1);
  const base = `/standards/${version.slug}`;
  const published = version.events.find((event) => event.kind === "published");
  const withdrawn = version.events.find((event) => event.kind === "withdrawn");

  return (
    <>
      <PageHeader
        title={version.title}
        lead={version.summary}
        actions={
          leads ? (
            <>
              {previous ? (
                <Link
                  href={`${base}/diff?from=${previous.number}&to=${version.number}`}
                  className="self-center text-sm text-plate-700 hover:underline"
                >
                  What changed since v{previous.number}
                </Link>
              ) : null}
              <StartDraftButton versionId={version.id} number={version.number} />
            </>
          ) : null
        }
      />
      <dl
        className="grid gap-x-8 gap-y-2 rounded-plate bg-paper-raised p-4 text-sm shadow-sheet ring-1 ring-ink-200 sm:grid-cols-[auto_minmax(0,1fr)]"
        data-testid="version-meta"
      >
        <dt className="text-ink-500">Version</dt>
        <dd className="flex flex-wrap items-center gap-2">
          <span className="font-mono font-semibold" data-testid="version-number">
            v{version.number}
          </span>
          <VersionStatusBadge status={version.status} />
          <span className="text-ink-500">{version.category}</span>
        </dd>
        <dt className="text-ink-500">Written by</dt>
        <dd>{version.authorName}</dd>
        <dt className="text-ink-500">Approved by</dt>
        <dd data-testid="version-reviewer">
          {version.reviewerName}
          {published ? (
            <>
              , published <LocalTime iso={published.occurredAt} timeZone={timeZone} />
            </>
          ) : null}
        </dd>
        <dt className="text-ink-500">Changelog</dt>
        <dd data-testid="version-changelog">{version.changelog}</dd>
        {withdrawn ? (
          <>
            <dt className="text-fault-700">Withdrawn</dt>
            <dd className="text-fault-700">
              {withdrawn.reason} ({withdrawn.actorName}, <LocalTime iso={withdrawn.occurredAt} timeZone={timeZone} />)
              {withdrawal?.withdrawalId && can(actor.role, "runs.read") ? (
                <>
                  {" "}
                  <Link
                    href={`/withdrawals/${withdrawal.withdrawalId}`}
                    className="text-plate-700 hover:underline"
                    data-testid="impact-report-link"
                  >
                    Impact report
                  </Link>
                </>
              ) : null}
            </dd>
          </>
        ) : null}
        <dt className="text-ink-500">Content hash</dt>
        <dd className="font-mono text-xs break-all text-ink-700" data-testid="content-hash">
          sha256:{version.contentHash}
        </dd>
        <dt className="text-ink-500">Verified with</dt>
        <dd className="text-ink-700">{version.verifiedWith}</dd>
        {version.libraryPins.length > 0 ? (
          <>
            <dt className="text-ink-500">Libraries</dt>
            <dd>
              <LibraryPins pins={version.libraryPins} />
            </dd>
          </>
        ) : null}
        {can(actor.role, "runs.read") ? (
          <>
            <dt className="text-ink-500">Runs</dt>
            <dd>
              <Link
                href={`${base}/versions/${version.number}/runs`}
                className="text-plate-700 hover:underline"
                data-testid="version-runs"
              >
                Every run of this version
              </Link>
            </dd>
          </>
        ) : null}
      </dl>
      {compiled.ok ? (
        <VersionBody version={version} compiled={compiled.standard} />
      ) : (
        <p className="mt-6 rounded-plate bg-fault-100 p-4 text-fault-700" data-testid="version-unreadable">
          This version no longer compiles with this release of Gusset: {compiled.problems[0]?.message}. Its runs stay on record; a
          standards lead should publish a corrected version.
        </p>
      )}
      <Section title="Verification at publication" id="verification-heading">
        <VerificationTable results={version.verification as VerificationResult[]} />
      </Section>
      <Section title="Version history" id="history-heading">
        <ol className="divide-y divide-ink-100 rounded-plate bg-paper-raised ring-1 ring-ink-200" data-testid="version-history">
          {history.map((item) => (
            <li key={item.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 px-4 py-3 text-sm" data-testid="history-row">
              <Link href={`${base}/versions/${item.number}`} className="font-mono font-semibold text-plate-800 hover:underline">
                v{item.number}
              </Link>
              <VersionStatusBadge status={item.status} />
              <span className="text-ink-700">{item.changelog}</span>
              <span className="text-ink-500">
                {item.authorName} · approved by {item.reviewerName}
              </span>
              {item.number > 1 ? (
                <Link
                  href={`${base}/diff?from=${item.number - 1}&to=${item.number}`}
                  className="text-plate-700 underline underline-offset-2"
                >
                  diff with v{item.number - 1}
                </Link>
              ) : null}
            </li>
          ))}
        </ol>
      </Section>
      {can(actor.role, "templates.withdraw") && version.status !== "withdrawn" ? (
        <Section title="Withdraw this version" id="withdraw-heading">
          <WithdrawForm
            versionId={version.id}
            number={version.number}
            inputs={withdrawal?.inputs ?? {}}
            successors={withdrawal?.successors ?? []}
          />
        </Section>
      ) : null}
    </>
  );
}

function VersionBody({
  version,
  compiled,
}: {
  version: VersionDto;
  compiled: Extract<ReturnType<typeof compileStandard>, { ok: true }>["standard"];
}) {
  const { definition } = compiled;
  const outcome = compiled.evaluate();
  return (
    <>
      <Section title="Scope and limitations" id="scope-heading">
        <p className="text-ink-900">{definition.scope}</p>
        {definition.limitations.length > 0 ? (
          <ul className="mt-2 list-disc space-y-1 pl-6 text-ink-700" data-testid="limitations">
            {definition.limitations.map((limitation) => (
              <li key={limitation}>{limitation}</li>
            ))}
          </ul>
        ) : null}
        {definition.references.length > 0 ? (
          <p className="mt-3 text-sm text-ink-500">References: {definition.references.join("; ")}</p>
        ) : null}
      </Section>
      <Section title="Inputs" id="inputs-heading">
        <TableFrame testId="inputs-table" label="Inputs" headings={["Input", "Default", "Range", "Help"]}>
          {Object.entries(definition.inputs).map(([key, input]) => (
            <tr key={key} data-testid="input-row" data-key={key}>
              <td className="px-4 py-2">
                <span className="font-medium text-ink-900">{input.label}</span>{" "}
                <span className="font-mono text-xs text-ink-500">{key}</span>
              </td>
              <td className="px-4 py-2 whitespace-nowrap tabular">
                {input.quantity === "choice" ? String(input.default) : String(input.default ?? "—")}
              </td>
              <td className="px-4 py-2 whitespace-nowrap text-ink-700 tabular">
                {input.quantity === "choice"
                  ? (input.choices ?? []).join(" / ")
                  : [input.min ? `≥ ${input.min}` : null, input.max ? `≤ ${input.max}` : null].filter(Boolean).join(", ") || "—"}
              </td>
              <td className="px-4 py-2 text-ink-700">{input.help ?? ""}</td>
            </tr>
          ))}
        </TableFrame>
      </Section>
      {outcome.ok ? (
        <>
          <Section title="Model at the default inputs" id="model-heading">
            <ModelDrawing model={outcome.evaluation.model} name={version.title} />
          </Section>
          <Section title="Calculation at the default inputs" id="narrative-heading">
            <Caution />
            <NarrativeView
              definition={definition}
              narrative={compiled.narrative}
              evaluation={outcome.evaluation}
              title={version.title}
            />
          </Section>
          <Section title="Checks at the default inputs" id="checks-heading">
            <div data-testid="checks">
              {Object.entries(outcome.evaluation.checks).map(([key, check]) => (
                <CheckLine key={key} name={key} check={check} />
              ))}
            </div>
            <p className="mt-2 text-sm">
              Overall:{" "}
              <Badge tone={outcome.evaluation.pass ? "pass" : "fault"} testId="overall">
                {outcome.evaluation.pass ? "every check passes" : "a check fails"}
              </Badge>
            </p>
          </Section>
        </>
      ) : (
        <p className="mt-6 rounded-plate bg-warn-100 p-4 text-warn-700">
          The default inputs could not be evaluated ({outcome.stage}).
        </p>
      )}
    </>
  );
}

const HOW: Record<LibraryReferencePin["how"], string> = {
  named: "named in the source",
  pinned: "latest, pinned when this version was published",
  "as-of-publication": "latest when this version was published (before pins were recorded)",
};

/** Each library the version reads, the version it reads, how that was decided, and whether a newer one exists. */
function LibraryPins({ pins }: { pins: LibraryReferencePin[] }) {
  return (
    <ul className="space-y-1" data-testid="library-pins">
      {pins.map((pin) => (
        <li
          key={`${pin.library}@${pin.requested}`}
          data-testid="library-pin"
          data-library={pin.library}
          data-version={pin.version ?? ""}
        >
          {pin.version === null ? (
            <span className="font-mono">{pin.library}</span>
          ) : (
            <Link href={`/libraries/${pin.library}/versions/${pin.version}`} className="font-mono text-plate-700 hover:underline">
              {pin.library} v{pin.version}
            </Link>
          )}{" "}
          <span className="text-ink-500">
            ({HOW[pin.how]}; for {pin.inputs.join(", ")})
          </span>
          {pin.version === null ? (
            <span className="text-fault-700"> No version was published then: this version cannot be run.</span>
          ) : null}
          {pin.status === "withdrawn" ? (
            <span className="text-fault-700"> That library version is withdrawn: this version cannot be run.</span>
          ) : pin.newer !== null ? (
            <span className="text-ink-500" data-testid="library-pin-newer">
              {" "}
              v{pin.newer} is newer; a new version of this standard would take it.
            </span>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

function VerificationTable({ results }: { results: VerificationResult[] }) {
  return (
    <TableFrame
      testId="verification-table"
      label="Verification cases"
      headings={["Case", "Value", "Expected (SI)", "Computed (SI)", "Result"]}
    >
      {results.flatMap((result) =>
        (result.checks.length > 0 ? result.checks : [null]).map((check, index) => (
          <tr
            key={`${result.name}-${check?.target ?? index}`}
            data-testid="verification-row"
            data-pass={result.pass ? "true" : "false"}
          >
            <td className="min-w-[14rem] px-4 py-2 align-top">
              {index === 0 ? (
                <>
                  <span className="font-medium text-ink-900">{result.name}</span>
                  <p className="max-w-sm text-xs text-ink-500">{result.source}</p>
                  <HandCalculationCitation result={result} />
                </>
              ) : null}
            </td>
            <td className="px-4 py-2 font-mono text-xs">{check?.target ?? result.failure ?? ""}</td>
            <td className="px-4 py-2 whitespace-nowrap tabular">
              {check ? trimZeros(formatSignificant(check.expected, 6)) : "—"}
            </td>
            <td className="px-4 py-2 whitespace-nowrap tabular">
              {check?.actual !== null && check?.actual !== undefined ? trimZeros(formatSignificant(check.actual, 6)) : "—"}
            </td>
            <td className="px-4 py-2">
              <Badge tone={(check?.pass ?? result.pass) ? "pass" : "fault"}>
                {(check?.pass ?? result.pass) ? "Pass" : "Fail"}
              </Badge>
            </td>
          </tr>
        )),
      )}
    </TableFrame>
  );
}
