"use client";
// The hand calculations attached to the draft's standard, and (for the author) a way to attach another: the
// file goes to the server, which stores it under its sha256 and answers with the line a verification case
// cites it by. A published version's cases can only cite files attached here.
import { useState } from "react";
import { useUpload } from "@/components/ui/use-upload";
import { FileField } from "@/components/ui/file-field";
import type { AttachmentDto } from "@/lib/data/standards";
import { handCalculationUrl } from "@/components/standards/hand-calculation";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";

type Attached = { sha256: string; fileName: string; added: boolean };

export function HandCalculations({
  draftId,
  attachments,
  canAttach,
}: {
  draftId: string;
  attachments: AttachmentDto[];
  canAttach: boolean;
}) {
  const [file, setFile] = useState<File | null>(null);
  const {
    pending,
    error,
    setError,
    done: attached,
    upload,
  } = useUpload<Attached>({
    fields: ["file"],
    failed: "the file was not attached; try again.",
  });

  async function attach(event: React.FormEvent) {
    event.preventDefault();
    if (!file) return setError("Choose the hand calculation's file (PDF, PNG or JPEG).");
    const body = new FormData();
    body.set("file", file);
    await upload(`/api/standards/drafts/${encodeURIComponent(draftId)}/hand-calculations`, body);
  }

  return (
    <section aria-labelledby="hand-calculations-heading" className="mt-8" data-testid="hand-calculations">
      <h2 id="hand-calculations-heading" className="mb-2 text-lg font-semibold text-ink-900">
        Hand calculations
      </h2>
      <p className="mb-3 max-w-prose text-sm text-ink-700">
        A verification case whose expected values were worked out by hand cites the checker and the calculation, attached here, by
        its sha256:{" "}
        <code className="font-mono text-xs">
          hand_calculation: {"{"} checker: …, file: …, sha256: … {"}"}
        </code>
        . Submitting and publishing need every cited file attached.
      </p>
      {attachments.length === 0 ? (
        <p className="text-sm text-ink-500">No hand calculation is attached to this standard.</p>
      ) : (
        <ul className="space-y-1 text-sm" data-testid="attachment-list">
          {attachments.map((a) => (
            <li key={a.sha256} data-testid="attachment" data-sha256={a.sha256}>
              <a className="underline" href={handCalculationUrl(a.sha256)} download={a.fileName}>
                {a.fileName}
              </a>{" "}
              <span className="text-ink-500">
                ({Math.max(1, Math.round(a.bytes / 1024))} kB, attached by {a.uploadedByName})
              </span>{" "}
              <span className="font-mono text-xs break-all text-ink-500">sha256 {a.sha256}</span>
            </li>
          ))}
        </ul>
      )}
      {canAttach ? (
        <form noValidate onSubmit={attach} className="mt-4 flex flex-wrap items-end gap-3" data-testid="attach-form">
          <FileField
            label="Attach a hand calculation (PDF, PNG or JPEG, up to 10 MB)"
            accept="application/pdf,image/png,image/jpeg"
            testId="attach-file"
            onFile={setFile}
          />
          <Button type="submit" size="sm" pending={pending} pendingLabel="Attaching…" data-testid="attach-submit">
            Attach
          </Button>
        </form>
      ) : null}
      {error ? <FormError message={error} /> : null}
      {attached ? (
        <Notice tone="pass" testId="attach-done">
          {attached.added ? "Attached" : "Already attached"}: {attached.fileName}. Cite it in a verification case with{" "}
          <code className="font-mono text-xs break-all" data-testid="attach-citation">
            {`hand_calculation: { checker: "<checker's name>", file: "${attached.fileName}", sha256: "${attached.sha256}" }`}
          </code>
        </Notice>
      ) : null}
    </section>
  );
}
