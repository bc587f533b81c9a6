// A labelled form field with its error message tied to the input for screen readers.
import { forwardRef, useId } from "react";

type Props = React.InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: string; unit?: string };

export const Field = forwardRef<HTMLInputElement, Props>(function Field({ label, error, hint, unit, className = "", id, ...rest }, ref) {
  const auto = useId();
  const inputId = id ?? auto;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={inputId} className="text-sm font-medium">
        {label}
      </label>
      <div className="flex items-center gap-2">
        <input
          ref={ref}
          id={inputId}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${inputId}-err` : hint ? `${inputId}-hint` : undefined}
          className={`min-h-10 w-full rounded-md border bg-white px-3 py-2 text-sm text-ink dark:bg-paper-2 ${error ? "border-bad" : "border-line"}`}
          {...rest}
        />
        {unit && <span className="font-mono text-sm text-ink-2">{unit}</span>}
      </div>
      {hint && !error && (
        <p id={`${inputId}-hint`} className="text-xs text-ink-2">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${inputId}-err`} role="alert" className="text-xs font-medium text-bad">
          {error}
        </p>
      )}
    </div>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, React.SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string }>(
  function SelectField({ label, error, className = "", id, children, ...rest }, ref) {
    const auto = useId();
    const selId = id ?? auto;
    return (
      <div className={`flex flex-col gap-1 ${className}`}>
        <label htmlFor={selId} className="text-sm font-medium">
          {label}
        </label>
        <select
          ref={ref}
          id={selId}
          aria-invalid={error ? true : undefined}
          className={`min-h-10 rounded-md border bg-white px-3 py-2 text-sm text-ink dark:bg-paper-2 ${error ? "border-bad" : "border-line"}`}
          {...rest}
        >
          {children}
        </select>
        {error && (
          <p role="alert" className="text-xs font-medium text-bad">
            {error}
          </p>
        )}
      </div>
    );
  },
);

export const TextAreaField = forwardRef<HTMLTextAreaElement, React.TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string }>(
  function TextAreaField({ label, error, className = "", id, ...rest }, ref) {
    const auto = useId();
    const taId = id ?? auto;
    return (
      <div className={`flex flex-col gap-1 ${className}`}>
        <label htmlFor={taId} className="text-sm font-medium">
          {label}
        </label>
        <textarea
          ref={ref}
          id={taId}
          rows={3}
          aria-invalid={error ? true : undefined}
          className={`rounded-md border bg-white px-3 py-2 text-sm text-ink dark:bg-paper-2 ${error ? "border-bad" : "border-line"}`}
          {...rest}
        />
        {error && (
          <p role="alert" className="text-xs font-medium text-bad">
            {error}
          </p>
        )}
      </div>
    );
  },
);
