"use client";
// Files kept on a job or on one of its runs (sketches, site photos, PDFs): the list, each with its size, who
// attached it and its sha256, and for those who may attach, a form that sends the file to the server, which
// tells its type from the bytes, stores it in S3 and keeps a row. Downloads go through the same permission checks.
import { useId, useState } from "react";
import { useUpload } from "@/components/ui/use-upload";
import { FileField } from "@/components/ui/file-field";
import type { AttachmentDto } from "@/lib/data/files";
import { Button } from "@/components/ui/button";
import { FormError, Notice } from "@/components/ui/notice";
import { LocalTime } from "@/components/local-time";

type Attached = { fileName: string; added: boolean; sha256: string };

const kB = (bytes: number) => `${Math.max(1, Math.round(bytes / 1024)).toLocaleString("en")} kB`;

export function Attachments({
  jobNumber,
  runId,
  attachments,
  canAttach,
}: {
  jobNumber: string;
  runId: string | null;
  attachments: AttachmentDto[];
  canAttach: boolean;
}) {
  const noteId = useId();
  const [file, setFile] = useState<File | null>(null);
  const [note, setNote] = useState("");
  const {
    pending,
    error,
    setError,
    done: attached,
    upload,
  } = useUpload<Attached>({
    fields: ["file", "note"],
    failed: "the file was not attached; try again.",
  });

  async function attach(event: React.FormEvent) {
    event.preventDefault();
    if (!file) return setError("Choose a file to attach (PDF, PNG, JPEG or WebP).");
    const body = new FormData();
    body.set("file", file);
    body.set("note", note);
    if (runId) body.set("runId", runId);
    if (await upload(`/api/jobs/${encodeURIComponent(jobNumber)}/attachments`, body)) setNote("");
  }

  return (
    <div data-testid="attachments">
      {attachments.length === 0 ? (
        <p className="text-sm text-ink-500">No file is attached to this {runId ? "run" : "job"}.</p>
      ) : (
        <ul className="space-y-2 text-sm" data-testid="attachment-list">
          {attachments.map((a) => (
            <li key={a.id} data-testid="attachment" data-sha256={a.sha256}>
              <a className="font-medium text-plate-700 underline" href={`/api/attachments/${a.id}`} download={a.fileName}>
                {a.fileName}
              </a>{" "}
              <span className="text-ink-500">
                ({kB(a.bytes)}, attached by {a.uploadedByName}, <LocalTime iso={a.uploadedAt} />)
              </span>
              {a.note ? <span className="block text-ink-700">{a.note}</span> : null}
              <span className="block font-mono text-xs break-all text-ink-500">sha256 {a.sha256}</span>
            </li>
          ))}
        </ul>
      )}
      {canAttach ? (
        <form noValidate onSubmit={attach} className="mt-4 flex flex-wrap items-end gap-3" data-testid="attach-form">
          <FileField
            label="File (PDF, PNG, JPEG or WebP, up to 20 MB)"
            accept="application/pdf,image/png,image/jpeg,image/webp"
            testId="attach-file"
            onFile={setFile}
          />
          <div className="min-w-0 grow">
            <label htmlFor={noteId} className="mb-1 block text-sm font-medium text-ink-700">
              What it is (optional)
            </label>
            <input
              id={noteId}
              type="text"
              value={note}
              maxLength={200}
              placeholder="Site photo, north gable"
              onChange={(event) => setNote(event.target.value)}
              className="w-full rounded-plate border border-ink-300 bg-white px-3 py-1.5 text-sm"
              data-testid="attach-note"
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
          {attached.added ? "Attached" : "Already attached here"}: {attached.fileName} (sha256 {attached.sha256.slice(0, 12)}…).
        </Notice>
      ) : null}
    </div>
  );
}
