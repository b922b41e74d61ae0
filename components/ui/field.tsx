import { forwardRef, useId, type InputHTMLAttributes, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";

// Labelled inputs with the error in plain words beneath, tied to the control by aria-describedby.
type FieldShellProps = { label: string; error?: string; hint?: string; errorTestId?: string };

const controlClasses = (invalid: boolean) =>
  `block w-full rounded-plate bg-paper-raised px-3 py-2 text-sm text-ink-900 ring-1 ring-inset placeholder:text-ink-400 focus:outline-none focus:ring-2 ${
    invalid ? "ring-fault-600 focus:ring-fault-600" : "ring-ink-300 focus:ring-plate-500"
  }`;

/** Label above, hint or error below; `render` draws the control with the ids and aria it needs. */
function FieldShell({
  id,
  label,
  error,
  hint,
  errorTestId,
  className,
  render,
}: FieldShellProps & {
  id: string;
  className?: string;
  render: (aria: { id: string; "aria-invalid"?: true; "aria-describedby"?: string; className: string }) => React.ReactNode;
}) {
  const describedBy = error ? `${id}-error` : hint ? `${id}-hint` : undefined;
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-ink-700">
        {label}
      </label>
      {render({
        id,
        "aria-invalid": error ? true : undefined,
        "aria-describedby": describedBy,
        className: controlClasses(Boolean(error)),
      })}
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} role="alert" className="mt-1 text-sm text-fault-700" data-testid={errorTestId}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

export const TextField = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & FieldShellProps>(function TextField(
  { label, error, hint, errorTestId, id, className, ...rest },
  ref,
) {
  const autoId = useId();
  return (
    <FieldShell
      id={id ?? autoId}
      {...{ label, error, hint, errorTestId, className }}
      render={(aria) => <input {...rest} {...aria} ref={ref} />}
    />
  );
});

export const SelectField = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement> & FieldShellProps>(
  function SelectField({ label, error, hint, errorTestId, id, className, children, ...rest }, ref) {
    const autoId = useId();
    return (
      <FieldShell
        id={id ?? autoId}
        {...{ label, error, hint, errorTestId, className }}
        render={(aria) => (
          <select {...rest} {...aria} ref={ref}>
            {children}
          </select>
        )}
      />
    );
  },
);

/** Several lines of text: a description; `monospace` for a pasted file or a JSON entry. */
export const TextAreaField = forwardRef<
  HTMLTextAreaElement,
  TextareaHTMLAttributes<HTMLTextAreaElement> & FieldShellProps & { monospace?: boolean }
>(function TextAreaField({ label, error, hint, errorTestId, id, className, monospace, ...rest }, ref) {
  const autoId = useId();
  return (
    <FieldShell
      id={id ?? autoId}
      {...{ label, error, hint, errorTestId, className }}
      render={(aria) => (
        <textarea {...rest} {...aria} className={monospace ? `${aria.className} font-mono` : aria.className} ref={ref} />
      )}
    />
  );
});

/** The e-mail input of the sign-in, password and invitation forms. */
export const EmailField = forwardRef<
  HTMLInputElement,
  InputHTMLAttributes<HTMLInputElement> & { error?: string; label?: string; errorTestId?: string }
>(function EmailField({ label = "E-mail", ...rest }, ref) {
  return (
    <TextField
      label={label}
      type="email"
      autoComplete="username"
      inputMode="email"
      data-testid="email"
      errorTestId="email-error"
      {...rest}
      ref={ref}
    />
  );
});
