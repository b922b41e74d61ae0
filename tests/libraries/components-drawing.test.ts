/**
 * The section drawing (components/libraries/section-drawing.tsx and its layout): the outline is to scale
 * (its proportions are the dimensions'), every dimension is labelled with its value in mm, the centroid and
 * the axes are where the builder puts them, and no demo section draws a NaN. Markup as the server renders it.
 */
import { describe, expect, it } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { buildDemoCatalogue, buildSectionOrThrow, type Section } from "@/lib/libraries";
import { SectionDrawing } from "@/components/libraries/section-drawing";
import { BOX, layoutSection } from "@/components/libraries/section-drawing-layout";
import { dimensionKeys, formatMm } from "@/components/libraries/format";

const draw = (section: Section, name?: string) => renderToStaticMarkup(createElement(SectionDrawing, { section, name }));
const close = (actual: number, expected: number, rel = 1e-3) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));

/** Every point of an SVG path (M, L, H, V and A ends), as [x, y]. */
function pointsOf(path: string): [number, number][] {
  const out: [number, number][] = [];
  for (const m of path.matchAll(/([MLA])([^MLAZ]+)/g)) {
    const n = m[2]
      .trim()
      .split(/[\s,]+/)
      .map(Number);
    out.push([n[n.length - 2], n[n.length - 1]]);
  }
  return out;
}
const outlineOf = (html: string) => html.match(/<path d="([^"]+)"[^>]*data-outline/)![1];
const arcRadii = (path: string) => [...path.matchAll(/A([\d.]+) /g)].map((m) => Number(m[1]));

const demo = buildDemoCatalogue();
const named = (designation: string) => demo.find((s) => s.designation === designation)!.section;

describe("the section drawing", () => {
  it.each(demo.map((s) => [s.designation, s.section] as const))(
    "%s: every dimension labelled in mm, an accessible name, a scale bar, no NaN",
    (designation, section) => {
      const html = draw(section, designation);
      expect(html).not.toMatch(/NaN|undefined|Infinity/);
      expect(html).toContain('role="img"');
      const dims = section.dimensions as unknown as Record<string, number>;
      for (const key of dimensionKeys(section.shape)) {
        const value = `${formatMm(dims[key])} mm`;
        expect(html, `aria-label names ${key}`).toMatch(new RegExp(`aria-label="[^"]*${key} ${value.replace(".", "\\.")}`));
        // Radii of zero are sharp corners: nothing to point at.
        if (dims[key] > 0) expect(html, `label of ${key}`).toContain(`>${key} = ${value}</text>`);
      }
      expect(html).toMatch(/data-scale-bar="\d+"/);
      // The outline, the axes and the scale bar stay inside the part of the box shown.
      const [vx, vy, vw, vh] = html
        .match(/viewBox="([^"]+)"/)![1]
        .split(" ")
        .map(Number);
      const scene = layoutSection(section);
      const inside = [...pointsOf(outlineOf(html)), ...scene.axes.flatMap((a) => [a.from, a.to].map((p) => [p.x, p.y]))];
      inside.push([scene.scaleBar.x, scene.scaleBar.y]);
      for (const [x, y] of inside) {
        expect(x).toBeGreaterThanOrEqual(vx);
        expect(x).toBeLessThanOrEqual(vx + vw);
        expect(y).toBeGreaterThanOrEqual(vy);
        expect(y).toBeLessThanOrEqual(vy + vh);
      }
    },
  );

  it("an I section's outline has the flange width over the depth b/d, the flange thickness tf and the web tw, at one scale", () => {
    const section = named("GI 300x150x10.5"); // b 150, d 300, tf 10.5, tw 7, r 14 mm
    const path = outlineOf(draw(section));
    const points = pointsOf(path);
    const xs = points.map((p) => p[0]);
    const ys = points.map((p) => p[1]);
    const [width, height] = [Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)];
    close(width / height, 150 / 300);
    const scale = height / 300; // box units per mm
    // The flange's inner face lies tf below the top; the web's faces are tw apart.
    const top = Math.min(...ys);
    expect(ys.some((y) => Math.abs(y - (top + 10.5 * scale)) < 0.02)).toBe(true);
    const centre = (Math.max(...xs) + Math.min(...xs)) / 2;
    expect(xs.some((x) => Math.abs(x - (centre + 3.5 * scale)) < 0.02)).toBe(true);
    expect(xs.some((x) => Math.abs(x - (centre - 3.5 * scale)) < 0.02)).toBe(true);
    // Four root fillets of radius r.
    const radii = arcRadii(path);
    expect(radii).toHaveLength(4);
    for (const r of radii) close(r, 14 * scale, 2e-3);
  });

  it("a small and a large section both fill the box, and the scale bar is drawn at the drawing's scale", () => {
    for (const designation of ["GI 160x90x7.5", "GI 600x220x19"]) {
      const scene = layoutSection(named(designation));
      const drawnHeight = scene.extent.bottom - scene.extent.top;
      expect(drawnHeight).toBeGreaterThan(0.6 * BOX.height);
      close(scene.scaleBar.length / scene.scaleBar.millimetres, scene.scale, 1e-3);
    }
    expect(layoutSection(named("GI 160x90x7.5")).scale).toBeGreaterThan(layoutSection(named("GI 600x220x19")).scale);
  });

  it("a channel's centroid is marked xc from the back of the web, and labelled with it", () => {
    const section = named("GC 200x80x11");
    const scene = layoutSection(section);
    const xc = (section.properties as { xc: number }).xc * 1000;
    close((scene.centroid.x - scene.extent.left) / scene.scale, xc, 2e-3);
    expect(draw(section)).toContain(`>xc = ${Number(xc.toPrecision(4)).toFixed(2)} mm</text>`);
  });

  it("an angle's centroid sits at (xc, yc) from the heel and its u axis at alpha", () => {
    const section = named("GL 100x75x8");
    const p = section.properties as { xc: number; yc: number; alpha: number };
    const scene = layoutSection(section);
    close((scene.centroid.x - scene.extent.left) / scene.scale, p.xc * 1000, 2e-3);
    close((scene.extent.bottom - scene.centroid.y) / scene.scale, p.yc * 1000, 2e-3);
    const u = scene.axes.find((a) => a.name === "u")!;
    // Page y points down, so the slope on the page is −tan(alpha).
    close(-(u.to.y - u.from.y) / (u.to.x - u.from.x), Math.tan(p.alpha), 2e-3);
    expect(scene.axes.map((a) => a.name)).toEqual(["x", "y", "u", "v"]);
    // Root fillet r and two toe radii r2.
    const radii = arcRadii(scene.outline).map((r) => r / scene.scale);
    expect(radii.sort((a, b) => a - b).map((r) => Math.round(r * 10) / 10)).toEqual([5, 5, 10]);
  });

  it("a rectangular hollow section's corners are ro outside and max(ro − t, 0) inside", () => {
    const rounded = layoutSection(named("GR 150x100x6")); // t 6, ro 12 → ri 6
    const radii = arcRadii(rounded.outline).map((r) => Math.round((r / rounded.scale) * 10) / 10);
    expect(radii.filter((r) => r === 12)).toHaveLength(4);
    expect(radii.filter((r) => r === 6)).toHaveLength(4);
    const tight = layoutSection(buildSectionOrThrow({ shape: "rectangular-hollow", b: 0.1, d: 0.1, t: 0.008, ro: 0.006 }));
    expect(arcRadii(tight.outline)).toHaveLength(4); // ro < t: a square hole
  });

  it("a circular hollow section is two circles, D/2 and D/2 − t; a solid circle one", () => {
    const tube = layoutSection(named("GT 168x6"));
    const radii = [...new Set(arcRadii(tube.outline).map((r) => Math.round((r / tube.scale) * 10) / 10))];
    expect(radii).toEqual([84, 78]);
    const bar = layoutSection(buildSectionOrThrow({ shape: "circle", D: 0.05 }));
    expect(new Set(arcRadii(bar.outline).map((r) => Math.round(r / bar.scale)))).toEqual(new Set([25]));
  });

  it("a flat plate 1000 × 10 mm keeps its proportions, in a box no taller than it needs", () => {
    const scene = layoutSection(buildSectionOrThrow({ shape: "rectangle", b: 1, d: 0.01 }));
    close((scene.extent.right - scene.extent.left) / (scene.extent.bottom - scene.extent.top), 100, 5e-3);
    expect(scene.viewBox.height).toBeLessThan(BOX.height / 2);
  });
});

describe("a tapered flange", () => {
  it.each(["i", "channel"] as const)(
    "%s with a 14 %% slope: the outline's corners where the slope puts them, named in its accessible name",
    (shape) => {
      const dims = { b: 0.09, d: 0.2, tf: 0.0113, tw: 0.0075, r: 0.0075, taper: 0.14 };
      const section = buildSectionOrThrow({ shape, ...dims });
      const html = draw(section);
      expect(html).not.toMatch(/NaN|undefined|Infinity/);
      expect(html).toMatch(/aria-label="[^"]*, inner flange slope 14 %"/);
      // The flange's tip is tf − slope × outstand/2 thick: its inner corner sits that far below the top, to scale.
      const scene = layoutSection(section);
      const points = pointsOf(outlineOf(html));
      const outstand = shape === "i" ? (dims.b - dims.tw) / 2 : dims.b - dims.tw;
      const tip = (dims.tf - (0.14 * outstand) / 2) * 1000 * scene.scale;
      const right = Math.max(...points.map(([x]) => x));
      const top = Math.min(...points.map(([, y]) => y));
      const atTip = points.filter(([x]) => Math.abs(x - right) < 0.01).map(([, y]) => y - top);
      close(Math.min(...atTip.filter((y) => y > 0.01)), tip, 0.01);
    },
  );
});
