// A standard's narrative as the engineer reads it: the sanitised HTML tree (lib/standards/narrative.ts) with
// each placeholder filled from one evaluation — an input's value, a derivation (formula, values substituted,
// result) typeset by KaTeX, an extract with where it occurs, a check with its utilisation, the model drawing,
// a member diagram. Server-rendered; nothing in a narrative runs as code.
import "katex/dist/katex.min.css";
import katex from "katex";
import { Fragment, jsx, jsxs } from "react/jsx-runtime";
import { toJsxRuntime, type Components } from "hast-util-to-jsx-runtime";
import { analyze, memberDiagram, memberEnvelope, type DiagramQuantity, type AnalysisOutcome } from "@/lib/engine";
import type { Definition } from "@/lib/standards/definition";
import type { Evaluation } from "@/lib/standards/evaluate";
import { derivationLatex } from "@/lib/standards/derivation";
import { narrativeToHast } from "@/lib/standards/narrative";
import { ModelDrawing } from "./model-drawing";
import { MemberDiagram } from "./member-diagram";
import { CheckLine } from "./check-line";

type PlaceholderProps = Record<string, unknown>;

/** Our own LaTeX (formulae built from the definition); trust off, so no \href or \htmlClass reaches the page. */
function TeX({ latex, display = false, label }: { latex: string; display?: boolean; label?: string }) {
  const html = katex.renderToString(latex, { displayMode: display, output: "htmlAndMathml", throwOnError: false, trust: false });
  // A long equation scrolls sideways in its own box; keyboard users reach that box with Tab to scroll it.
  return display ? (
    <div
      className="overflow-x-auto py-1"
      tabIndex={0}
      role="region"
      aria-label={label ?? "Equation"}
      dangerouslySetInnerHTML={{ __html: html }}
    />
  ) : (
    <span dangerouslySetInnerHTML={{ __html: html }} />
  );
}

function Missing({ what }: { what: string }) {
  return <span className="rounded bg-fault-100 px-1 text-fault-700">[{what}]</span>;
}

export function NarrativeView({
  definition,
  narrative,
  evaluation,
  title,
}: {
  definition: Definition;
  narrative: string;
  evaluation: Evaluation;
  title: string;
}) {
  let analysis: AnalysisOutcome | null = null;
  const analysed = () => (analysis ??= analyze(evaluation.model));
  // The placeholders' attributes arrive as React props with their HTML names (`data-name`, `data-of`).
  const text = (props: PlaceholderProps, key: string) => {
    const value = props[`data-${key}`];
    return typeof value === "string" ? value : "";
  };

  const components: Partial<Components> = {
    "gusset-input": (props: PlaceholderProps) => {
      const input = evaluation.inputs[text(props, "name")];
      return input ? <strong className="font-semibold text-ink-900 tabular">{input.display}</strong> : <Missing what="input" />;
    },
    "gusset-derivation": (props: PlaceholderProps) => {
      const key = text(props, "of");
      if (!definition.derived[key]) return <Missing what="derivation" />;
      const { symbolic, substituted, result } = derivationLatex(definition, evaluation, key);
      const label = definition.derived[key].label;
      return (
        <div className="my-3 rounded-plate bg-paper-sunk px-4 py-2 text-ink-900" data-testid="derivation" data-of={key}>
          {label ? <div className="text-xs font-medium text-ink-500">{label}</div> : null}
          <TeX
            latex={`${symbolic} ${substituted} ${result}`}
            display
            label={label ? `Derivation: ${label}` : `Derivation of ${key}`}
          />
        </div>
      );
    },
    "gusset-extract": (props: PlaceholderProps) => {
      const key = text(props, "name");
      const extract = evaluation.extracts[key];
      if (!extract) return <Missing what="extract" />;
      const where = extract.where;
      const place = [
        where.member ? `member ${where.member}` : null,
        where.node ? `node ${where.node}` : null,
        where.under ? `under ${where.under}` : null,
      ]
        .filter(Boolean)
        .join(", ");
      return (
        <span data-testid="extract" data-name={key}>
          <strong className="font-semibold text-ink-900 tabular">{extract.display}</strong>
          {place ? <span className="text-ink-500"> ({place})</span> : null}
        </span>
      );
    },
    "gusset-check": (props: PlaceholderProps) => {
      const key = text(props, "name");
      const check = evaluation.checks[key];
      return check ? <CheckLine name={key} check={check} /> : <Missing what="check" />;
    },
    "gusset-model-drawing": () => <ModelDrawing model={evaluation.model} name={title} className="my-4" />,
    "gusset-diagram": (props: PlaceholderProps) => {
      const member = text(props, "member");
      const of = text(props, "of") as DiagramQuantity;
      const under = text(props, "under");
      const outcome = analysed();
      if (!outcome.ok) return <Missing what="diagram: the model could not be analysed" />;
      const isEnvelope = (evaluation.model.envelopes ?? []).some((envelope) => envelope.id === under);
      const modelMember = (evaluation.model.members ?? []).find((m) => m.id === member);
      if (!modelMember) return <Missing what={`diagram: no member ${member}`} />;
      const diagram = isEnvelope ? memberEnvelope(outcome.result, member, under) : memberDiagram(outcome.result, member, under);
      return <MemberDiagram diagram={diagram} of={of} startNode={modelMember.start} endNode={modelMember.end} className="my-4" />;
    },
  };

  const tree = narrativeToHast(narrative);
  return (
    <div
      className="max-w-none space-y-3 text-[0.95rem] leading-relaxed text-ink-900 [&_h1]:text-xl [&_h1]:font-semibold [&_h1]:text-ink-950 [&_h2]:mt-6 [&_h2]:text-lg [&_h2]:font-semibold [&_h2]:text-ink-900 [&_h3]:mt-4 [&_h3]:font-semibold [&_h3]:text-ink-900 [&_ol]:list-decimal [&_ol]:pl-6 [&_ul]:list-disc [&_ul]:pl-6"
      data-testid="narrative"
    >
      {toJsxRuntime(tree, { Fragment, jsx, jsxs, components: components as Components, passNode: false })}
    </div>
  );
}
