// The narrative as a reader sees it: every placeholder of a starting standard filled from one evaluation
// (inputs with their values, derivations typeset with values substituted, extracts, checks), nothing left as
// a "[missing]" marker, and no script or event handler in what is rendered.
import fs from "node:fs";
import path from "node:path";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { compileStandard } from "@/lib/standards/compile";
import { NarrativeView } from "@/components/standards/narrative-view";

const source = fs.readFileSync(
  path.resolve(import.meta.dirname, "..", "..", "content", "standards", "simply-supported-beam", "2.mdx"),
  "utf8",
);

describe("the narrative view", () => {
  const compiled = compileStandard(source);
  if (!compiled.ok) throw new Error("the starting standard does not compile");
  const outcome = compiled.standard.evaluate();
  if (!outcome.ok) throw new Error("the starting standard does not evaluate");
  const html = renderToStaticMarkup(
    createElement(NarrativeView, {
      definition: compiled.standard.definition,
      narrative: compiled.standard.narrative,
      evaluation: outcome.evaluation,
      title: "Simply supported steel beam",
    }),
  );

  it("fills every placeholder: no missing marker is left", () => {
    expect(html).not.toMatch(/\[(input|derivation|extract|check|diagram)[^\]]*\]/);
  });

  it("shows each input's value, each derivation typeset, and each check with its utilisation", () => {
    expect(html).toContain(outcome.evaluation.inputs.L.display);
    const derivations = [...html.matchAll(/data-testid="derivation" data-of="([^"]+)"/g)].map((m) => m[1]);
    expect(derivations.length).toBeGreaterThan(0);
    for (const key of derivations) expect(Object.keys(compiled.standard.definition.derived)).toContain(key);
    expect(html).toMatch(/class="katex"/);
    const checks = [...html.matchAll(/data-testid="check" data-name="([^"]+)"/g)].map((m) => m[1]);
    expect(checks.sort()).toEqual(expect.arrayContaining(["bending"]));
    expect(html).toContain(`utilisation ${outcome.evaluation.checks.bending.utilisationShown}`);
  });

  it("renders no script and no event handler", () => {
    expect(html).not.toMatch(/<script|\son[a-z]+=/i);
  });
});
