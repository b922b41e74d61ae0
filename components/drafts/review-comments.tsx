"use client";
// The comments a reviewer is writing on a submission before returning it: each with what it is about (a line of
// a standard's source, an entry of a library, or the whole), its text, and a button to drop it.
import type { ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/field";

export function ReviewCommentDrafts<C extends { body: string }>({
  comments,
  onChange,
  describe,
}: {
  comments: C[];
  onChange: (comments: C[]) => void;
  /** The comment field's label, and what to show above it. */
  describe: (comment: C) => { label: string; context?: ReactNode };
}) {
  return (
    <>
      {comments.map((comment, index) => {
        const { label, context } = describe(comment);
        return (
          <div key={index} className="rounded-plate bg-paper-raised p-3 ring-1 ring-ink-200" data-testid="review-comment-draft">
            {context}
            <TextField
              label={label}
              value={comment.body}
              data-testid="review-comment-body"
              onChange={(event) => onChange(comments.map((c, i) => (i === index ? { ...c, body: event.target.value } : c)))}
            />
            <Button type="button" variant="quiet" size="sm" onClick={() => onChange(comments.filter((_, i) => i !== index))}>
              Remove comment
            </Button>
          </div>
        );
      })}
    </>
  );
}
