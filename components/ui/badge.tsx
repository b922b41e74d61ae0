type Tone = "neutral" | "plate" | "pass" | "warn" | "fault";

const TONES: Record<Tone, string> = {
  neutral: "bg-ink-100 text-ink-700",
  plate: "bg-plate-100 text-plate-800",
  pass: "bg-pass-100 text-pass-700",
  warn: "bg-warn-100 text-warn-700",
  fault: "bg-fault-100 text-fault-700",
};

export function Badge({ tone = "neutral", children, testId }: { tone?: Tone; children: React.ReactNode; testId?: string }) {
  return (
    <span
      data-testid={testId}
      className={`inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium whitespace-nowrap ${TONES[tone]}`}
    >
      {children}
    </span>
  );
}
