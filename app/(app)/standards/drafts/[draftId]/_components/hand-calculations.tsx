"use client";
// The hand calculations attached to the draft's standard, and (for the author) a way to attach another: the
// file goes to the server, which stores it under its sha256 and answers with the line a verification case
// cites it by. A published version's cases can only cite files attached here.
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
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
  const router = useRouter();
  const inputId = useId();
  const [file, setFile] = useState<File | null>(null);
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [attached, setAttached] = useState<Attached | null>(null);

  async function attach(event: React.FormEvent) {
    event.preventDefault();
    if (!file) return setError("Choose the hand calculation's file (PDF, PNG or JPEG).");
    setPending(true);
    setError(null);
    try {
      const body = new FormData();
      body.set("file", file);
      const response = await fetch(`/api/standards/drafts/${encodeURIComponent(draftId)}/hand-calculations`, {
        method: "POST",
        body,
      });
      const answer = (await response.json().catch(() => null)) as {
        data?: Attached;
        error?: { message: string; fieldErrors?: Record<string, string[]> };
      } | null;
      if (!response.ok || !answer?.data)
        setError(answer?.error?.fieldErrors?.file?.[0] ?? answer?.error?.message ?? "The file could not be attached; try again.");
      else {
        setAttached(answer.data);
        router.refresh();
      }
    } catch {
      setError("The server did not answer; the file was not attached. Try again.");
    } finally {
      setPending(false);
    }
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
          <div>
            <label htmlFor={inputId} className="mb-1 block text-sm font-medium text-ink-700">
              Attach a hand calculation (PDF, PNG or JPEG, up to 10 MB)
            </label>
            <input
              id={inputId}
              type="file"
              accept="application/pdf,image/png,image/jpeg"
              className="block text-sm text-ink-900 file:mr-3 file:rounded-plate file:border-0 file:bg-paper-sunk file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-900 file:ring-1 file:ring-ink-300"
              data-testid="attach-file"
              onChange={(event) => setFile(event.target.files?.[0] ?? null)}
            />
          </div>
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
