"use client";
// Sends a multipart form to one of our route handlers and keeps what a form shows meanwhile: pending, the error
// to show (the first field error, else the message), or the answer's data. Refreshes the page after a success.
import { useRouter } from "next/navigation";
import { useState } from "react";

type Answer<T> = { data?: T; error?: { message: string; fieldErrors?: Record<string, string[]> } } | null;

export function useUpload<T>({ fields, failed }: { fields: string[]; failed: string }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<T | null>(null);

  async function upload(url: string, body: FormData): Promise<T | null> {
    setPending(true);
    setError(null);
    setDone(null);
    try {
      const response = await fetch(url, { method: "POST", body });
      const answer = (await response.json().catch(() => null)) as Answer<T>;
      if (!response.ok || !answer?.data) {
        const fieldError = fields.map((field) => answer?.error?.fieldErrors?.[field]?.[0]).find(Boolean);
        setError(fieldError ?? answer?.error?.message ?? failed);
        return null;
      }
      setDone(answer.data);
      router.refresh();
      return answer.data;
    } catch {
      setError(`The server did not answer: ${failed}`);
      return null;
    } finally {
      setPending(false);
    }
  }

  return { pending, error, setError, done, upload };
}
