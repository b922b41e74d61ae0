"use client";
// A labelled file picker in the house style, for the forms that upload one file.
import { useId } from "react";

export function FileField({
  label,
  accept,
  testId,
  onFile,
}: {
  label: string;
  /** MIME types the picker offers (the server tells the type from the bytes anyway). */
  accept: string;
  testId: string;
  onFile: (file: File | null) => void;
}) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink-700">
        {label}
      </label>
      <input
        id={id}
        type="file"
        accept={accept}
        className="block max-w-full text-sm text-ink-900 file:mr-3 file:rounded-plate file:border-0 file:bg-paper-sunk file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-900 file:ring-1 file:ring-ink-300"
        data-testid={testId}
        onChange={(event) => onFile(event.target.files?.[0] ?? null)}
      />
    </div>
  );
}
