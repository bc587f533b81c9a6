import { forwardRef } from "react";

type Variant = "primary" | "secondary" | "danger" | "quiet";
const styles: Record<Variant, string> = {
  primary: "bg-lake text-on-lake hover:bg-lake-dark border border-lake",
  secondary: "bg-paper text-ink border border-line hover:bg-paper-2",
  danger: "bg-bad text-white border border-bad hover:opacity-90",
  quiet: "bg-transparent text-ink hover:bg-paper-2 border border-transparent",
};

export const Button = forwardRef<HTMLButtonElement, React.ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; busy?: boolean }>(
  function Button({ variant = "primary", busy, className = "", children, disabled, ...rest }, ref) {
    return (
      <button
        ref={ref}
        className={`inline-flex min-h-10 items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium disabled:cursor-not-allowed disabled:opacity-50 ${styles[variant]} ${className}`}
        disabled={disabled || busy}
        aria-busy={busy || undefined}
        {...rest}
      >
        {busy && <span className="inline-block h-3 w-3 animate-spin rounded-full border-2 border-current border-t-transparent" aria-hidden />}
        {children}
      </button>
    );
  },
);
