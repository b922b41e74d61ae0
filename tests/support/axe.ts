// axe-core's serious and critical findings on a page, for the page walk and the journeys. axe runs once, in
// the page, with every rule it runs by default, and hands back only its violations: @axe-core/playwright's
// analyze() injected axe twice, then again into a blank page of its own to merge the frames' results, and
// returned every passing node too — on the People page of a full test database (hundreds of rows) three
// times as long for the same violations. A page with frames still goes through AxeBuilder, which checks
// each frame.
import AxeBuilder from "@axe-core/playwright";
import axe from "axe-core";
import type { Page } from "playwright-core";

export type AxeFinding = { rule: string; impact: string; help: string; targets: string[] };

/** Every violation axe finds on the page as it is now, with its impact and the elements it found. */
export async function axeViolations(page: Page): Promise<AxeFinding[]> {
  if (page.frames().length > 1) {
    const { violations } = await new AxeBuilder({ page: page as never }).analyze();
    return violations.map((violation) => ({
      rule: violation.id,
      impact: violation.impact ?? "",
      help: violation.help,
      targets: violation.nodes.map((node) => node.target.join(" ")),
    }));
  }
  await page.evaluate(axe.source);
  return page.evaluate(async () => {
    const { violations } = await (window as unknown as { axe: typeof axe }).axe.run(document, { resultTypes: ["violations"] });
    return violations.map((violation) => ({
      rule: violation.id,
      impact: violation.impact ?? "",
      help: violation.help,
      targets: violation.nodes.map((node) => node.target.join(" ")),
    }));
  });
}

/** axe's serious and critical findings: each rule with its impact and the elements it found. */
export async function seriousViolations(page: Page): Promise<AxeFinding[]> {
  return (await axeViolations(page)).filter((finding) => finding.impact === "serious" || finding.impact === "critical");
}
