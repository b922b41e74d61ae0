"use client";
// A sections draft's entries: each designation with its shape, main dimensions and where it came from, the
// problems the check finds in it and the reviewer's comments on it, and a button to remove it. Below, a section
// made in the builder is added under a designation the draft does not hold yet.
import { useState } from "react";
import { normaliseKey, SECTION_SHAPES, type Section, type SectionShape } from "@/lib/libraries";
import { SectionBuilder } from "@/components/libraries/section-builder";
import { build, STARTING } from "@/components/libraries/section-builder-input";
import { mainDimensions, SHAPE_TITLES } from "@/components/libraries/format";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";
import { TableFrame } from "@/components/ui/table";
import { entryLabel, type DraftSection, type EntryProblems } from "./draft-document";
import { EntryRemarks } from "./entry-remarks";

export function SectionEntries({
  entries,
  problems,
  comments,
  onRemove,
}: {
  entries: unknown[];
  problems: EntryProblems;
  comments: Map<string, string[]>;
  onRemove: (index: number) => void;
}) {
  if (entries.length === 0)
    return (
      <p className="rounded-plate border border-dashed border-ink-300 p-6 text-sm text-ink-500" data-testid="draft-no-entries">
        No sections yet: add one with the builder or import the firm&apos;s catalogue below.
      </p>
    );
  return (
    <TableFrame
      testId="draft-entries"
      label="Sections in the draft"
      headings={["Designation", "Shape", "Dimensions (mm)", "From", "Problems and comments", { label: "Remove", hidden: true }]}
    >
      {entries.map((raw, index) => {
        const entry = raw as Partial<DraftSection>;
        const label = entryLabel(raw, index);
        const own = problems.byEntry.get(index) ?? [];
        const remarks = comments.get(normaliseKey(label)) ?? [];
        const shape = SECTION_SHAPES.includes(entry.shape as SectionShape) ? (entry.shape as SectionShape) : null;
        return (
          <tr key={index} data-testid="draft-entry" data-key={label} className="align-top">
            <td className="px-4 py-2 font-medium whitespace-nowrap text-ink-900">{label}</td>
            <td className="px-4 py-2 whitespace-nowrap">{shape ? SHAPE_TITLES[shape] : String(entry.shape ?? "—")}</td>
            <td className="px-4 py-2 whitespace-nowrap tabular text-ink-700">
              {shape && entry.dimensions ? mainDimensions(shape, entry.dimensions) : "—"}
            </td>
            <td className="px-4 py-2 whitespace-nowrap text-ink-500">
              {entry.origin?.from === "catalogue" ? `catalogue row ${entry.origin.row}` : "builder"}
            </td>
            <td className="min-w-64 px-4 py-2 text-xs">
              <EntryRemarks problems={own} comments={remarks} />
            </td>
            <td className="px-4 py-2 text-right">
              <Button
                type="button"
                variant="quiet"
                size="sm"
                aria-label={`Remove ${label}`}
                data-testid="draft-entry-remove"
                onClick={() => onRemove(index)}
              >
                Remove
              </Button>
            </td>
          </tr>
        );
      })}
    </TableFrame>
  );
}

/** The builder with a designation: adds the section to the draft once it builds and its name is new. */
export function AddSection({ draftKeys, onAdd }: { draftKeys: string[]; onAdd: (section: DraftSection) => void }) {
  // The builder opens on its starting I section, already built.
  const [section, setSection] = useState<Section | null>(startingSection);
  const [key, setKey] = useState("");
  const [added, setAdded] = useState<string | null>(null);
  const [builder, setBuilder] = useState(0);
  const name = key.trim();
  const taken = name !== "" && draftKeys.some((other) => normaliseKey(other) === normaliseKey(name));
  const error = taken ? `The draft already holds “${name}”; give the new section its own designation.` : undefined;
  return (
    <div className="space-y-4" data-testid="add-section">
      <TextField
        label="Designation (how standards and runs will name it)"
        value={key}
        maxLength={80}
        onChange={(event) => {
          setKey(event.target.value);
          setAdded(null);
        }}
        error={error}
        className="max-w-md"
        data-testid="add-section-key"
      />
      <SectionBuilder key={builder} name={name || undefined} onChange={setSection} />
      <div className="flex flex-wrap items-center gap-3">
        <Button
          type="button"
          disabled={!section || name === "" || taken}
          data-testid="add-section-submit"
          onClick={() => {
            if (!section) return;
            const { shape: _shape, ...dimensions } = section.dimensions as Record<string, unknown>;
            onAdd({
              key: name,
              origin: { from: "builder" },
              shape: section.shape,
              // The builder's newest rules; an entry already in the library keeps the rules it was built by.
              ...(section.rules === 1 ? {} : { rules: section.rules }),
              dimensions: dimensions as Record<string, number>,
            });
            setAdded(name);
            setKey("");
          }}
        >
          Add the section to the draft
        </Button>
        <span className="text-sm text-ink-500" aria-live="polite" data-testid="add-section-state">
          {added
            ? `${added} is in the draft; save it to keep it.`
            : name === ""
              ? "Give the section a designation first."
              : !section
                ? "Put the dimensions marked right first."
                : ""}
        </span>
      </div>
      {added ? (
        <Button
          type="button"
          variant="quiet"
          size="sm"
          onClick={() => {
            setBuilder((n) => n + 1);
            setSection(startingSection());
          }}
        >
          Start the builder afresh
        </Button>
      ) : null}
    </div>
  );
}

function startingSection(): Section | null {
  const { result } = build("i", STARTING.i);
  return result.ok ? result.section : null;
}
