/**
 * The diff between two versions of a standard: the structured part a reviewer reads and the line diff that
 * review comments attach to, on the starting library's real pair (simply supported beam 1 → 2: a D + L
 * deflection check added) and on small edits of the tests' beam.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { diffDefinitions, diffSourceLines, diffStandards, hunksOf, type EntryChange } from "@/lib/standards/diff";
import { beamDefinition, sourceOf } from "./helpers";

type Def = ReturnType<typeof beamDefinition> & Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

const beamVersion = (n: number) =>
  readFileSync(path.resolve(import.meta.dirname, `../../content/standards/simply-supported-beam/${n}.mdx`), "utf8");

function edited(change: (d: Def) => void): string {
  const d = beamDefinition() as Def;
  change(d);
  return sourceOf(d);
}

function changesOf(before: string, after: string): readonly EntryChange[] {
  const out = diffDefinitions(before, after);
  if (!out.comparable) throw new Error(JSON.stringify(out.problems));
  return out.changes;
}

/** The 1-based line of the first line of `source` that contains `text`. */
function lineWith(source: string, text: string): number {
  const i = source.split("\n").findIndex((line) => line.includes(text));
  if (i < 0) throw new Error(`no line contains ${text}`);
  return i + 1;
}

describe("simply supported beam, version 1 → 2", () => {
  const v1 = beamVersion(1);
  const v2 = beamVersion(2);
  const diff = diffStandards(v1, v2);

  it("lists exactly the added D + L deflection check and what it needs", () => {
    if (!diff.structured.comparable) throw new Error("not comparable");
    expect(diff.structured.changes.map((c) => [c.section, c.kind, c.key])).toEqual([
      ["metadata", "changed", "summary"],
      ["derived", "added", "delta_limit_total"],
      ["combinations", "added", "S"],
      ["extracts", "added", "delta_T"],
      ["checks", "added", "deflection_total"],
      ["verification", "added", "Dead and live uniform load, total deflection"],
    ]);
    expect(diff.structured.narrativeChanged).toBe(true);
  });

  it("shows the added check's expressions, relation and clause at their lines of version 2", () => {
    if (!diff.structured.comparable) throw new Error("not comparable");
    const check = diff.structured.changes.find((c) => c.key === "deflection_total")!;
    expect(check.newLine).toBe(lineWith(v2, "  deflection_total:"));
    expect(check.oldLine).toBeUndefined();
    expect(check.fields).toEqual([
      { field: "label", new: "Total-load deflection", newLine: lineWith(v2, "  deflection_total:") + 1 },
      { field: "demand", new: "delta_T", newLine: lineWith(v2, "demand: delta_T") },
      { field: "capacity", new: "delta_limit_total", newLine: lineWith(v2, "capacity: delta_limit_total") },
      { field: "clause", new: "IBC 2015 Table 1604.3, floor members, D + L, L/240", newLine: lineWith(v2, "D + L, L/240") },
      {
        field: "fails",
        new: "The deflection under dead plus live load exceeds span/240; choose a stiffer section or camber the beam.",
        newLine: lineWith(v2, "exceeds span/240"),
      },
      { field: "unit", new: "mm", newLine: lineWith(v2, "  deflection_total:") + 6 },
    ]);
    const combination = diff.structured.changes.find((c) => c.key === "S")!;
    expect(combination.fields.map((f) => [f.field, f.new])).toEqual([
      ["id", "S"],
      ["name", "D + L (service)"],
      ["factors.D", "1"],
      ["factors.L", "1"],
    ]);
  });

  it("numbers every line by the file it is in", () => {
    const oldLines = v1.split("\n");
    const newLines = v2.split("\n");
    for (const row of diff.lines) {
      if (row.oldLine !== undefined) expect(oldLines[row.oldLine - 1]).toBe(row.text);
      if (row.newLine !== undefined) expect(newLines[row.newLine - 1]).toBe(row.text);
      expect(row.kind === "same").toBe(row.oldLine !== undefined && row.newLine !== undefined);
    }
    expect(diff.lines.filter((r) => r.oldLine !== undefined)).toHaveLength(
      v1.endsWith("\n") ? oldLines.length - 1 : oldLines.length,
    );
    expect(diff.lines.filter((r) => r.newLine !== undefined)).toHaveLength(
      v2.endsWith("\n") ? newLines.length - 1 : newLines.length,
    );
    // `diff 1.mdx 2.mdx`: line 7 became 7–8, then 1 + 1 + 1 + 7 + 5 + 6 lines added.
    expect([diff.removed, diff.added]).toEqual([1, 23]);
    const added = diff.lines.find((r) => r.text === "  deflection_total:")!;
    expect(added).toEqual({ kind: "added", newLine: 105, text: "  deflection_total:" });
  });
});

describe("structured changes", () => {
  it("a changed default shows the old and the new value at their lines", () => {
    const before = sourceOf(beamDefinition());
    const after = edited((d) => (d.inputs.L.default = "7.5 m"));
    expect(changesOf(before, after)).toEqual([
      {
        section: "inputs",
        key: "L",
        kind: "changed",
        fields: [
          {
            field: "default",
            old: "6 m",
            new: "7.5 m",
            oldLine: lineWith(before, "default: 6 m"),
            newLine: lineWith(after, "default: 7.5 m"),
          },
        ],
        oldLine: lineWith(before, "  L:"),
        newLine: lineWith(after, "  L:"),
      },
    ]);
  });

  it("a renamed input is removed and added, and what reads it has changed", () => {
    const after = edited((d) => {
      d.inputs = { L: d.inputs.L, w: d.inputs.w, E: d.inputs.E, I_x: d.inputs.I };
      d.model.members[0].I = "I_x";
    });
    const changes = changesOf(sourceOf(beamDefinition()), after);
    expect(changes.map((c) => [c.section, c.kind, c.key])).toEqual([
      ["inputs", "removed", "I"],
      ["inputs", "added", "I_x"],
      ["members", "changed", "beam"],
    ]);
    expect(changes[0]!.fields.map((f) => [f.field, f.old, f.new])).toContainEqual(["default", "1e8 mm^4", undefined]);
    expect(changes[2]!.fields).toMatchObject([{ field: "I", old: "I", new: "I_x" }]);
  });

  it("identical sources give an empty diff", () => {
    const source = beamVersion(2);
    const diff = diffStandards(source, source);
    expect(diff.identical).toBe(true);
    expect(diff.structured).toEqual({ comparable: true, changes: [], narrativeChanged: false });
    expect(hunksOf(diff.lines)).toEqual([]);
    expect([diff.added, diff.removed]).toEqual([0, 0]);
  });

  it("a check's relation, derived expression and a load inside a load case show old → new", () => {
    const after = edited((d) => {
      d.checks.bending.relation = ">=";
      d.checks.bending.clause = "another clause";
      d.derived.M_cap.expr = "350 kN m";
      d.model.load_cases[0].loads[0].w = "-1.2 * w";
    });
    const changes = changesOf(sourceOf(beamDefinition()), after);
    expect(changes.map((c) => [c.section, c.key, c.fields.map((f) => [f.field, f.old, f.new])])).toEqual([
      ["derived", "M_cap", [["expr", "300 kN m", "350 kN m"]]],
      ["load_cases", "W", [["loads[0].w", "-w", "-1.2 * w"]]],
      [
        "checks",
        "bending",
        [
          ["relation", "<=", ">="],
          ["clause", "test", "another clause"],
        ],
      ],
    ]);
  });

  it("writing out a default the schema fills in is no change", () => {
    const after = edited((d) => {
      d.checks.bending.relation = "<=";
      d.model.members[0].kind = "frame";
    });
    expect(changesOf(sourceOf(beamDefinition()), after)).toEqual([]);
  });

  it("an assumption inserted at the top is one added entry, not every entry shifted", () => {
    const one = { text: "Braced.", confirm: "preparer" };
    const two = { text: "Stocky web.", check: "1 <= 2" };
    const before = edited((d) => (d.assumptions = [one, two]));
    const after = edited(
      (d) => (d.assumptions = [{ text: "New first.", confirm: "preparer" }, one, { ...two, text: "Stockier web." }]),
    );
    expect(changesOf(before, after).map((c) => [c.section, c.kind, c.key, c.fields.map((f) => [f.field, f.old, f.new])])).toEqual(
      [
        [
          "assumptions",
          "added",
          "#1",
          [
            ["text", undefined, "New first."],
            ["confirm", undefined, "preparer"],
          ],
        ],
        ["assumptions", "changed", "#3", [["text", "Stocky web.", "Stockier web."]]],
      ],
    );
  });

  it("a source that does not parse still gets its line diff", () => {
    const before = sourceOf(beamDefinition());
    const after = before.replace("title: Test beam", "title: [unclosed");
    const diff = diffStandards(before, after);
    expect(diff.structured.comparable).toBe(false);
    if (diff.structured.comparable) return;
    expect(diff.structured.problems[0]).toMatchObject({ side: "new", problem: { message: expect.stringMatching(/^YAML: /) } });
    expect(diff.lines.filter((r) => r.kind !== "same")).toEqual([
      { kind: "removed", oldLine: 2, text: "title: Test beam" },
      { kind: "added", newLine: 2, text: "title: [unclosed" },
    ]);
  });
});

describe("line diff", () => {
  it("numbers old and new lines and groups changes into hunks with context", () => {
    const before = ["a", "b", "c", "d", "e", "f", "g", "h", "i", "j"].join("\n") + "\n";
    const after = ["a", "B", "c", "d", "e", "f", "g", "h", "i", "j", "k"].join("\n") + "\n";
    const rows = diffSourceLines(before, after);
    expect(rows.slice(0, 4)).toEqual([
      { kind: "same", oldLine: 1, newLine: 1, text: "a" },
      { kind: "removed", oldLine: 2, text: "b" },
      { kind: "added", newLine: 2, text: "B" },
      { kind: "same", oldLine: 3, newLine: 3, text: "c" },
    ]);
    expect(rows[rows.length - 1]).toEqual({ kind: "added", newLine: 11, text: "k" });
    expect(hunksOf(rows, 1).map((h) => [h.oldStart, h.oldCount, h.newStart, h.newCount])).toEqual([
      [1, 3, 1, 3],
      [10, 1, 10, 2],
    ]);
    // With 3 lines of context the two hunks are 7 unchanged lines apart and stay separate; with 4 they merge.
    expect(hunksOf(rows, 3)).toHaveLength(2);
    expect(hunksOf(rows, 4)).toHaveLength(1);
  });

  it("a line ending and a missing final line break are changes; CRLF is not", () => {
    expect(diffSourceLines("a\r\nb\r\n", "a\nb\n").every((r) => r.kind === "same")).toBe(true);
    expect(diffSourceLines("a\nb\n", "a\nb")).toEqual([
      { kind: "same", oldLine: 1, newLine: 1, text: "a" },
      { kind: "removed", oldLine: 2, text: "b" },
      { kind: "added", newLine: 2, text: "b", noNewlineAtEnd: true },
    ]);
  });

  it("an empty side starts after the line before its hunk", () => {
    const rows = diffSourceLines("a\nb\n", "a\nx\nb\n");
    expect(hunksOf(rows, 0)).toEqual([
      { oldStart: 1, oldCount: 0, newStart: 2, newCount: 1, rows: [{ kind: "added", newLine: 2, text: "x" }] },
    ]);
  });
});
