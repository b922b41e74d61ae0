import "server-only";
// A draft as its version page would show it, at the default inputs: the model, the narrative with its
// equations, the checks and the verification cases. The evaluation runs in the evaluation pool (previewDraft
// for the saved source, previewSource for the text being typed), so a runaway draft is stopped there.
import type { Actor } from "@/lib/domain/actor";
import type { SourceCheck } from "@/lib/use-cases/standard-gate";
import { runUseCase } from "@/lib/use-cases/run";
import { previewDraft, type DraftPreviewData } from "@/lib/use-cases/standards";
import { NarrativeView } from "@/components/standards/narrative-view";
import { ModelDrawing } from "@/components/standards/model-drawing";
import { CheckLine } from "@/components/standards/check-line";
import { Caution } from "@/components/standards/caution";
import { Badge } from "@/components/ui/badge";
import { HandCalculationCitation } from "@/components/standards/hand-calculation";

export async function DraftPreview({ actor, draftId, check }: { actor: Actor; draftId: string; check: SourceCheck | null }) {
  const preview = check && check.problems.length === 0 ? await runUseCase(previewDraft, { actor, input: { draftId } }) : null;
  return (
    <PreviewSection title="Preview of the saved draft, at the default inputs" testId="draft-preview">
      <PreviewContent check={check} preview={preview} which="saved draft" />
    </PreviewSection>
  );
}

export function PreviewSection({ title, testId, children }: { title: string; testId: string; children: React.ReactNode }) {
  return (
    <section aria-labelledby={`${testId}-heading`} className="mt-10" data-testid={testId}>
      <h2 id={`${testId}-heading`} className="mb-3 text-lg font-semibold text-ink-900">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** The preview of a checked source: `check` null when checking it took too long, `preview` null while it has problems. */
export function PreviewContent({
  check,
  preview,
  which,
}: {
  check: SourceCheck | null;
  preview: DraftPreviewData | null;
  which: "saved draft" | "text";
}) {
  if (!check) return <p className="text-ink-700">The preview is not available: checking the {which} took too long.</p>;
  if (check.problems.length > 0 || !preview)
    return (
      <p className="text-ink-700">
        The preview appears once the {which} compiles (fix the problems listed {which === "text" ? "in the editor" : "above"}).
      </p>
    );
  if (!preview.ok) return <p className="text-ink-700">{preview.message}</p>;
  const { definition, narrative, evaluation } = preview;
  return (
    <>
      <ModelDrawing model={evaluation.model} name={definition.title} />
      <Caution />
      <NarrativeView definition={definition} narrative={narrative} evaluation={evaluation} title={definition.title} />
      <div className="mt-6" data-testid="preview-checks">
        {Object.entries(evaluation.checks).map(([key, value]) => (
          <CheckLine key={key} name={key} check={value} />
        ))}
      </div>
      <h3 className="mt-6 mb-2 font-semibold text-ink-900">Verification cases on the current engine</h3>
      <ul className="space-y-1" data-testid="preview-verification">
        {check.verification.map((result) => (
          <li key={result.name} className="flex flex-wrap items-center gap-2 text-sm">
            <Badge tone={result.pass ? "pass" : "fault"}>{result.pass ? "Pass" : "Fail"}</Badge>
            <span className="text-ink-900">{result.name}</span>
            <span className="text-ink-500">{result.source}</span>
            <HandCalculationCitation result={result} />
            {!result.pass ? (
              <span className="text-fault-700">
                {result.failure ??
                  result.checks
                    .filter((c) => !c.pass)
                    .map((c) => `${c.target}: ${c.message}`)
                    .join("; ")}
              </span>
            ) : null}
          </li>
        ))}
      </ul>
    </>
  );
}
