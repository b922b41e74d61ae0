/**
 * The narrative of a standard: MDX, read but never compiled or run. It is parsed (remark-parse + remark-mdx +
 * remark-math), checked — no imports or exports, no `{…}` expressions but comments, no HTML, no component
 * outside NARRATIVE_COMPONENTS and no attribute outside each one's list, every name it points at defined —
 * and turned into a HTML tree (hast) with its mathematics typeset by KaTeX and sanitised with an allowlist that
 * keeps KaTeX's markup. The components are placeholders (`gusset-check` …) that the app fills with values.
 */
import { unified } from "unified";
import remarkParse from "remark-parse";
import remarkMdx from "remark-mdx";
import remarkMath from "remark-math";
import remarkRehype from "remark-rehype";
import rehypeKatex from "rehype-katex";
import rehypeSanitize, { defaultSchema, type Options as SanitizeSchema } from "rehype-sanitize";
import type { Root as HastRoot, Element as HastElement } from "hast";
import type { Root as MdastRoot, RootContent } from "mdast";
import type { Definition } from "./definition";
import type { SourceProblem } from "./source";

/** Components a narrative may use, each with its attributes and what kind of name each attribute holds. */
export const NARRATIVE_COMPONENTS: Readonly<
  Record<string, Readonly<Record<string, "input" | "derived" | "extract" | "check" | "text" | "diagram">>>
> = {
  Input: { name: "input" },
  Derivation: { of: "derived" },
  Extract: { name: "extract" },
  Check: { name: "check" },
  ModelDrawing: {},
  Diagram: { member: "text", of: "diagram", under: "text" },
};
const DIAGRAM_QUANTITIES = ["N", "V", "M", "deflection"];

export const MAX_NARRATIVE_LENGTH = 100_000;

interface Positioned {
  position?: { start: { line: number; column: number } };
}

/** MDX's own pitfalls, said so a person knows what to write instead. */
function explainParseError(message: string): string {
  if (/to create a comment in MDX/.test(message)) return "HTML comments are not allowed; write a comment as {/* … */}";
  if (/before name, expected a character that can start a name/.test(message))
    return "A `<` that does not start a component must be written as `&lt;`, or inside mathematics: $1 < 2$";
  if (/Could not parse expression/.test(message))
    return "A `{` must be escaped as `\\{`, or put inside mathematics ($…$ or $$ on its own lines)";
  return message.split("\n")[0];
}

function parse(narrative: string): MdastRoot {
  return unified().use(remarkParse).use(remarkMdx).use(remarkMath).parse(narrative) as MdastRoot;
}

type NameKind = "input" | "derived" | "extract" | "check";
function namesOf(definition: Definition, kind: NameKind): ReadonlySet<string> {
  const record = {
    input: definition.inputs,
    derived: definition.derived,
    extract: definition.extracts,
    check: definition.checks,
  }[kind];
  return new Set(Object.keys(record));
}

/** Every problem of a narrative, each at its line and column in the file (the narrative starts at `firstLine`). */
export function checkNarrative(narrative: string, definition: Definition, firstLine: number): SourceProblem[] {
  const at = (node: Positioned | undefined, message: string): SourceProblem => {
    const start = node?.position?.start;
    return { path: "narrative", message, ...(start ? { line: start.line + firstLine - 1, column: start.column } : {}) };
  };
  if (narrative.length > MAX_NARRATIVE_LENGTH)
    return [at(undefined, `The narrative is longer than ${MAX_NARRATIVE_LENGTH} characters`)];
  let tree: MdastRoot;
  try {
    tree = parse(narrative);
  } catch (error) {
    const e = error as { message: string; line?: number; column?: number };
    return [
      {
        path: "narrative",
        message: explainParseError(e.message),
        ...(e.line ? { line: e.line + firstLine - 1, column: e.column ?? 1 } : {}),
      },
    ];
  }
  const problems: SourceProblem[] = [];
  const visit = (node: RootContent | MdastRoot): void => {
    switch (node.type) {
      case "mdxjsEsm":
        problems.push(at(node, "Imports and exports are not allowed in a narrative"));
        return;
      case "mdxFlowExpression":
      case "mdxTextExpression":
        if (!/^\s*\/\*[\s\S]*\*\/\s*$/.test(node.value))
          problems.push(
            at(
              node,
              `\`{${node.value.slice(0, 40)}}\` would run as code; only comments {/* … */} may be written in braces (mathematics goes between $…$)`,
            ),
          );
        return;
      case "html":
        problems.push(at(node, "HTML is not allowed in a narrative"));
        return;
      case "mdxJsxFlowElement":
      case "mdxJsxTextElement": {
        const name = node.name ?? "";
        const allowed = Object.hasOwn(NARRATIVE_COMPONENTS, name) ? NARRATIVE_COMPONENTS[name] : undefined;
        if (!allowed) {
          problems.push(
            at(
              node,
              `<${name || "…"}> is not allowed; a narrative may use ${Object.keys(NARRATIVE_COMPONENTS)
                .map((c) => `<${c}>`)
                .join(", ")}`,
            ),
          );
          return;
        }
        const seen = new Set<string>();
        for (const attribute of node.attributes) {
          if (attribute.type !== "mdxJsxAttribute") {
            problems.push(at(node, `<${name}> may not take {…} attributes`));
            continue;
          }
          const kind = Object.hasOwn(allowed, attribute.name) ? allowed[attribute.name] : undefined;
          if (!kind) {
            const list = Object.keys(allowed);
            problems.push(
              at(node, `<${name}> has no attribute \`${attribute.name}\`${list.length ? `; it takes ${list.join(", ")}` : ""}`),
            );
            continue;
          }
          if (typeof attribute.value !== "string") {
            problems.push(at(node, `<${name} ${attribute.name}> must be a quoted text, e.g. ${attribute.name}="…"`));
            continue;
          }
          seen.add(attribute.name);
          if (kind === "diagram" && !DIAGRAM_QUANTITIES.includes(attribute.value))
            problems.push(at(node, `<${name} of="${attribute.value}"> must be one of ${DIAGRAM_QUANTITIES.join(", ")}`));
          if (kind !== "text" && kind !== "diagram" && !namesOf(definition, kind).has(attribute.value))
            problems.push(
              at(
                node,
                `<${name} ${attribute.name}="${attribute.value}"> names no ${kind === "derived" ? "derived value" : kind}`,
              ),
            );
        }
        for (const required of Object.keys(allowed))
          if (!seen.has(required)) problems.push(at(node, `<${name}> needs its \`${required}\` attribute`));
        if (node.children.length > 0) problems.push(at(node, `<${name}> takes no content; write it as <${name} … />`));
        return;
      }
      default:
        if ("children" in node) for (const child of node.children as RootContent[]) visit(child);
    }
  };
  visit(tree);
  return problems;
}

/** Tag names of the placeholders the app fills: `Check` → `gusset-check`, `ModelDrawing` → `gusset-model-drawing`. */
export function placeholderTag(component: string): string {
  return `gusset-${component.replace(/[A-Z]/g, (c, i: number) => (i === 0 ? c.toLowerCase() : `-${c.toLowerCase()}`))}`;
}

/** KaTeX's HTML and MathML, our placeholders, and ordinary prose: nothing else survives. */
function sanitizeSchema(): SanitizeSchema {
  const katexTags = [
    "math",
    "semantics",
    "annotation",
    "mrow",
    "mi",
    "mn",
    "mo",
    "ms",
    "mtext",
    "mspace",
    "msup",
    "msub",
    "msubsup",
    "mfrac",
    "msqrt",
    "mroot",
    "mover",
    "munder",
    "munderover",
    "mtable",
    "mtr",
    "mtd",
    "mstyle",
    "mpadded",
    "mphantom",
    "menclose",
    "svg",
    "path",
    "line",
  ];
  const placeholders = Object.keys(NARRATIVE_COMPONENTS).map(placeholderTag);
  const attributes: SanitizeSchema["attributes"] = { ...defaultSchema.attributes };
  attributes["*"] = [...(attributes["*"] ?? []), "className", "style", "ariaHidden"];
  for (const tag of katexTags) attributes[tag] = ["*"];
  for (const [component, attrs] of Object.entries(NARRATIVE_COMPONENTS))
    attributes[placeholderTag(component)] = Object.keys(attrs).map((a) => `data${a[0].toUpperCase()}${a.slice(1)}`);
  return {
    ...defaultSchema,
    tagNames: [...(defaultSchema.tagNames ?? []), ...katexTags, ...placeholders],
    attributes,
    clobberPrefix: "narrative-",
    // KaTeX styles sizes with style attributes; no other element of a narrative can carry one (HTML is refused).
    strip: ["script", "style"],
  };
}

/** The narrative as a sanitised HTML tree with typeset mathematics; call only after checkNarrative found nothing. */
export function narrativeToHast(narrative: string): HastRoot {
  const placeholder = (
    _state: unknown,
    node: { name?: string | null; attributes: { type: string; name?: string; value?: unknown }[] },
  ): HastElement => ({
    type: "element",
    tagName: placeholderTag(node.name ?? ""),
    properties: Object.fromEntries(
      node.attributes
        .filter((a) => a.type === "mdxJsxAttribute" && typeof a.value === "string")
        .map((a) => [`data${a.name![0].toUpperCase()}${a.name!.slice(1)}`, a.value as string]),
    ),
    children: [],
  });
  const processor = unified()
    .use(remarkParse)
    .use(remarkMdx)
    .use(remarkMath)
    .use(remarkRehype, {
      handlers: {
        mdxJsxFlowElement: placeholder as never,
        mdxJsxTextElement: placeholder as never,
        // Comments in braces leave nothing behind.
        mdxFlowExpression: () => undefined,
        mdxTextExpression: () => undefined,
        mdxjsEsm: () => undefined,
      },
    })
    .use(rehypeKatex, { output: "htmlAndMathml", trust: false, strict: false })
    .use(rehypeSanitize, sanitizeSchema());
  const mdast = processor.parse(narrative);
  return processor.runSync(mdast) as HastRoot;
}
