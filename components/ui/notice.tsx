// A boxed message for a whole form or page: an error from the server, a confirmation, a caution.
type Tone = "fault" | "pass" | "warn" | "info";

const TONES: Record<Tone, string> = {
  fault: "bg-fault-100 text-fault-700 ring-fault-700/20",
  pass: "bg-pass-100 text-pass-700 ring-pass-700/20",
  warn: "bg-warn-100 text-warn-700 ring-warn-700/20",
  info: "bg-plate-50 text-plate-800 ring-plate-700/15",
};

export function Notice({
  tone = "info",
  title,
  children,
  testId,
}: {
  tone?: Tone;
  title?: string;
  children?: React.ReactNode;
  testId?: string;
}) {
  return (
    <div
      role={tone === "fault" ? "alert" : "status"}
      data-testid={testId}
      className={`rounded-plate px-4 py-3 text-sm ring-1 ring-inset ${TONES[tone]}`}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={title ? "mt-1" : undefined}>{children}</div> : null}
    </div>
  );
}

/** The server's answer to a whole form, when there is one. Tests find it as data-testid="form-error". */
export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <Notice tone="fault" testId="form-error">
      {message}
    </Notice>
  );
}
