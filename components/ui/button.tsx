import type { ButtonHTMLAttributes, Ref } from "react";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-plate-700 text-white hover:bg-plate-800 disabled:bg-plate-700/60",
  secondary: "bg-paper-raised text-ink-900 ring-1 ring-inset ring-ink-300 hover:bg-paper-sunk disabled:text-ink-400",
  quiet: "text-plate-700 hover:bg-plate-50 disabled:text-ink-400",
  danger: "bg-paper-raised text-fault-700 ring-1 ring-inset ring-fault-700/40 hover:bg-fault-100 disabled:text-ink-400",
};

export function buttonClasses(variant: Variant = "primary", size: "md" | "sm" = "md") {
  const sizing = size === "sm" ? "h-8 px-3 text-sm" : "h-10 px-4 text-sm";
  return `inline-flex items-center justify-center gap-2 rounded-plate font-medium transition-colors disabled:cursor-not-allowed ${sizing} ${VARIANTS[variant]}`;
}

type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  /** For moving focus to the button after an action (React 19 passes ref as a prop). */
  ref?: Ref<HTMLButtonElement>;
  variant?: Variant;
  size?: "md" | "sm";
  /** Shows a pending label and blocks a second submit while the server works. */
  pending?: boolean;
  pendingLabel?: string;
};

export function Button({ variant, size, pending, pendingLabel, className, children, disabled, ...rest }: ButtonProps) {
  return (
    <button
      {...rest}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      className={`${buttonClasses(variant, size)} ${className ?? ""}`}
    >
      {pending ? (pendingLabel ?? "Working…") : children}
    </button>
  );
}
