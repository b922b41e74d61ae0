"use client";
// The section builder on screen: a shape, its dimensions typed in mm, and the drawing and properties
// worked out in the browser as each key is typed (buildSection is pure and fast). A refusal is shown
// beside the field it names; while any field is wrong nothing is drawn, so no half-built number appears.
// Plain state: every keystroke is checked by buildSection itself, which a form library would only wrap.
import { useMemo, useState } from "react";
import { SECTION_SHAPES, type Section, type SectionShape } from "@/lib/libraries";
import { SelectField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { allDimensionKeys, dimensionLabel, formatMm, SHAPE_TITLES, SLOPE_DIMENSIONS } from "./format";
import { build, OPTIONAL, STARTING, type Typed } from "./section-builder-input";
import { SectionDrawing } from "./section-drawing";
import { SectionProperties } from "./section-properties";

export interface SectionBuilderProps {
  /** The section to start from (dimensions in metres); a 300 mm deep I section unless given. */
  initial?: { shape: SectionShape; dimensions: Record<string, unknown> };
  /** Called with the built section after every change, or null while a field is wrong. */
  onChange?: (section: Section | null) => void;
  /** A designation for the drawing's accessible name. */
  name?: string;
}

export function SectionBuilder({ initial, onChange, name }: SectionBuilderProps) {
  const [shape, setShape] = useState<SectionShape>(initial?.shape ?? "i");
  const [typed, setTyped] = useState<Typed>(() => {
    if (!initial) return STARTING;
    const own = Object.fromEntries(
      allDimensionKeys(initial.shape).map((key) => {
        const value = initial.dimensions[key];
        if (typeof value !== "number") return [key, ""];
        return [key, SLOPE_DIMENSIONS.has(key) ? String(Number((value * 100).toPrecision(6))) : formatMm(value)];
      }),
    );
    return { ...STARTING, [initial.shape]: own };
  });

  const { result, unreadable } = useMemo(() => build(shape, typed[shape]), [shape, typed]);
  const errors: Record<string, string> = { ...unreadable };
  const general: string[] = [];
  if (!result.ok)
    for (const problem of result.problems) {
      if (allDimensionKeys(shape).includes(problem.path)) errors[problem.path] ??= problem.message;
      else general.push(problem.message);
    }

  // The caller hears of a change from the event that made it, not from an effect after the render.
  const change = (nextShape: SectionShape, nextTyped: Typed) => {
    setShape(nextShape);
    setTyped(nextTyped);
    if (onChange) {
      const next = build(nextShape, nextTyped[nextShape]).result;
      onChange(next.ok ? next.section : null);
    }
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,18rem)_minmax(0,1fr)]" data-testid="section-builder">
      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Shape and dimensions</legend>
        <SelectField
          label="Shape"
          value={shape}
          onChange={(e) => change(e.target.value as SectionShape, typed)}
          data-testid="section-shape"
        >
          {SECTION_SHAPES.map((s) => (
            <option key={s} value={s}>
              {SHAPE_TITLES[s]}
            </option>
          ))}
        </SelectField>
        {allDimensionKeys(shape).map((key) => {
          const { symbol, name: what } = dimensionLabel(shape, key);
          const slope = SLOPE_DIMENSIONS.has(key);
          const label = `${what[0].toUpperCase()}${what.slice(1)}${slope ? "" : ` ${symbol}`} (${slope ? "%" : "mm"})`;
          return (
            <TextField
              key={`${shape}-${key}`}
              label={label}
              inputMode="decimal"
              autoComplete="off"
              value={typed[shape][key] ?? ""}
              onChange={(e) => change(shape, { ...typed, [shape]: { ...typed[shape], [key]: e.target.value } })}
              error={errors[key]}
              hint={
                slope
                  ? "Leave empty for parallel flanges. With a slope, tf is the thickness half-way along the outstand."
                  : OPTIONAL.has(key)
                    ? "Leave empty for a sharp corner."
                    : undefined
              }
              data-testid={`section-dimension-${key}`}
              errorTestId={`section-dimension-${key}-error`}
            />
          );
        })}
      </fieldset>
      <div className="min-w-0 space-y-4">
        {general.map((message) => (
          <Notice key={message} tone="fault">
            {message}
          </Notice>
        ))}
        {result.ok ? (
          <>
            <SectionDrawing section={result.section} name={name} />
            <SectionProperties section={result.section} />
          </>
        ) : (
          <p
            className="rounded-plate border border-dashed border-ink-300 p-6 text-sm text-ink-500"
            data-testid="section-builder-waiting"
          >
            The drawing and the properties appear once every dimension marked is put right.
          </p>
        )}
      </div>
    </div>
  );
}
