"use client";
// Reproducing a run from its trace: as issued (with the bundle that made it) or with today's bundle. The server
// evaluates it again in a worker thread and answers with the comparison; this shows the verdict and each output,
// identical or with its relative difference. Refusals (a bundle not kept, or altered) come back as the form's error.
import { startTransition, useActionState, useState } from "react";
import type { Reproduction } from "@/lib/use-cases/reproduce";
import type { ReproductionMode } from "@/lib/domain/schemas/trace";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";
import { ComparedTable } from "@/components/runs/compared-table";
import { actionErrors } from "@/components/action-errors";
import { reproduceRunAction } from "../../../actions";

const MODE_WORDS: Record<ReproductionMode, string> = {
  "as-issued": "as issued, with the bundle that made it",
  current: "with today's bundle",
};
const GROUP_WORDS = { derived: "derived value", extract: "extract", utilisation: "utilisation" } as const;
const PART_WORDS = { evaluation: "evaluation", analysis: "engine result", failure: "failure" } as const;

export function ReproducePanel({ runId, bundleSha256 }: { runId: string; bundleSha256: string }) {
  const [state, reproduce, pending] = useActionState(reproduceRunAction, null);
  const [asked, setAsked] = useState<ReproductionMode | null>(null);
  const server = actionErrors(state, []);
  const send = (mode: ReproductionMode) => {
    setAsked(mode);
    startTransition(() => reproduce({ id: runId, mode }));
  };
  return (
    <div className="space-y-4" data-testid="reproduce">
      <p className="max-w-3xl text-sm text-ink-700">
        The run&apos;s version and inputs are evaluated again in a worker thread and compared with its record: as issued with the
        evaluation bundle that made it (<span className="font-mono text-xs">sha256 {bundleSha256.slice(0, 12)}…</span>, kept in
        file storage and checked against its hash before it runs), or with today&apos;s bundle. Each reproduction is recorded in
        the audit events below.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button
          type="button"
          pending={pending && asked === "as-issued"}
          pendingLabel="Reproducing…"
          disabled={pending}
          onClick={() => send("as-issued")}
          data-testid="reproduce-as-issued"
        >
          Reproduce as issued
        </Button>
        <Button
          type="button"
          variant="secondary"
          pending={pending && asked === "current"}
          pendingLabel="Reproducing…"
          disabled={pending}
          onClick={() => send("current")}
          data-testid="reproduce-current"
        >
          Reproduce with today&apos;s bundle
        </Button>
      </div>
      <FormError message={server.form} />
      {state?.ok && !pending ? <ReproductionResult reproduction={state.data} /> : null}
    </div>
  );
}

function ReproductionResult({ reproduction }: { reproduction: Reproduction }) {
  const { comparison, mode, bundleSha256 } = reproduction;
  const verdict = comparison.identical
    ? "Identical: every output came out byte for byte as recorded."
    : comparison.differing > 0
      ? `Not identical: ${comparison.differing} output${comparison.differing === 1 ? " differs" : "s differ"}.`
      : comparison.parts.every((p) => p.identical)
        ? "Not identical: every output came out byte for byte as recorded, but another engine or evaluation made them."
        : "Not identical: the outputs are equal as numbers, but their record differs.";
  return (
    <div className="space-y-3" data-testid="reproduction" data-mode={mode} data-identical={comparison.identical ? "yes" : "no"}>
      <Notice
        tone={comparison.identical ? "pass" : "warn"}
        title={`Reproduced ${MODE_WORDS[mode]}`}
        testId="reproduction-verdict"
      >
        <p data-testid="reproduction-summary">{verdict}</p>
        {comparison.note ? <p>{comparison.note}</p> : null}
        <p className="mt-1 font-mono text-xs break-all">bundle sha256 {bundleSha256}</p>
        {comparison.identity ? (
          <p className="text-xs">
            Engine {comparison.identity.engine}, evaluation {comparison.identity.evaluation}
            {comparison.identity.same ? ", as recorded." : ", not the ones recorded."}
          </p>
        ) : null}
        <p className="text-xs">
          {comparison.parts.map((p) => `${PART_WORDS[p.part]}: ${p.identical ? "byte-identical" : "differs"}`).join(" · ")}
        </p>
      </Notice>
      {comparison.outputs.length > 0 ? (
        <ComparedTable
          rows={comparison.outputs}
          testId="reproduced-outputs"
          headings={["Output", "Recorded", "Reproduced", "Difference"]}
          rowTestId="reproduced-row"
          differenceTestId="reproduced-difference"
          sameWord="identical"
          nameOf={(output) => (
            <>
              {output.label} <span className="font-mono text-xs text-ink-500">{output.key}</span>
              <span className="block text-xs font-normal text-ink-500">{GROUP_WORDS[output.group]}</span>
            </>
          )}
        />
      ) : null}
    </div>
  );
}
