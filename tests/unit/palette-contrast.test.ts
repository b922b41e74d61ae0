// The palette in app/globals.css against WCAG 2's contrast ratio: every text colour the app uses must
// reach 4.5:1 on every background text sits on (paper, raised, sunk), and the table of ratios in the
// file's comment must be the ratios of the colours it names. Source: WCAG 2.2, success criterion 1.4.3
// and the definitions of "contrast ratio" and "relative luminance".
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(import.meta.dirname, "..", "..");
const css = fs.readFileSync(path.join(root, "app", "globals.css"), "utf8");

/** The @theme block's colour variables, e.g. { "ink-400": "#626b7e" }. */
function readPalette(source: string): Record<string, string> {
  const block = /@theme\s*{([^}]*)}/.exec(source)?.[1] ?? "";
  return Object.fromEntries(
    [...block.matchAll(/--color-([a-z0-9-]+):\s*(#[0-9a-f]{6})\s*;/gi)].map((m) => [m[1], m[2].toLowerCase()]),
  );
}

function relativeLuminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16) / 255);
  const linear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
  return 0.2126 * linear(r) + 0.7152 * linear(g) + 0.0722 * linear(b);
}

function contrastRatio(a: string, b: string): number {
  const [light, dark] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (light + 0.05) / (dark + 0.05);
}

/** Every `text-<colour>` class in app/ and components/ (including variants such as placeholder:). */
function textColoursUsed(): Set<string> {
  const used = new Set<string>();
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (/\.tsx?$/.test(entry.name)) {
        for (const m of fs.readFileSync(full, "utf8").matchAll(/\btext-((?:ink|plate|paper|pass|warn|fault)-[a-z0-9]+)\b/g))
          used.add(m[1]);
      }
    }
  };
  walk(path.join(root, "app"));
  walk(path.join(root, "components"));
  return used;
}

const palette = readPalette(css);
const BACKGROUNDS = ["paper", "paper-raised", "paper-sunk"] as const;

describe("the palette's contrast", () => {
  it("computes WCAG ratios as published (black on white 21:1, a grey of known ratio)", () => {
    expect(contrastRatio("#000000", "#ffffff")).toBeCloseTo(21, 5);
    expect(contrastRatio("#777777", "#ffffff")).toBeCloseTo(4.48, 2); // the well-known just-failing grey
  });

  it("reads the colours from app/globals.css", () => {
    expect(Object.keys(palette).length).toBeGreaterThan(10);
    for (const name of [...BACKGROUNDS, "ink-400", "ink-500"]) expect(palette[name], name).toMatch(/^#[0-9a-f]{6}$/);
  });

  it("every text colour used in app/ and components/ reaches 4.5:1 on paper, raised and sunk", () => {
    const used = [...textColoursUsed()];
    expect(used).toContain("ink-400");
    const failures = used.flatMap((name) => {
      const colour = palette[name];
      if (!colour) return [`text-${name} is not in the palette`];
      return BACKGROUNDS.map((bg) => ({ bg, ratio: contrastRatio(colour, palette[bg]) }))
        .filter(({ ratio }) => ratio < 4.5)
        .map(({ bg, ratio }) => `text-${name} ${colour} on ${bg}: ${ratio.toFixed(2)}:1`);
    });
    expect(failures).toEqual([]);
  });

  it("the grey the palette used to have would fail (so the check can fail)", () => {
    expect(contrastRatio("#838c9c", palette["paper-raised"])).toBeLessThan(4.5);
  });

  it("the table in the comment states the ratios of the colours it names", () => {
    const rows = [...css.matchAll(/^\s*\*\s+([a-z]+-\d+) (#[0-9a-f]{6})\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)/gm)];
    expect(rows.length).toBeGreaterThanOrEqual(11);
    for (const [, name, hex, ...stated] of rows) {
      expect(palette[name], name).toBe(hex);
      BACKGROUNDS.forEach((bg, i) =>
        expect(Number(stated[i]), `${name} on ${bg}`).toBeCloseTo(contrastRatio(hex, palette[bg]), 2),
      );
    }
  });
});
