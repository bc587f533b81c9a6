// The two tools under "Range & distance": the calculator and the range checks of flights.
import Link from "next/link";

export function RangeTabs({ current }: { current: "calculator" | "checks" }) {
  const tabs = [
    { key: "calculator", href: "/range", label: "Slant range calculator" },
    { key: "checks", href: "/range/checks", label: "Range checks" },
  ] as const;
  return (
    <nav aria-label="Range tools" className="mb-4 flex gap-1 border-b border-line">
      {tabs.map((t) => (
        <Link
          key={t.key}
          href={t.href}
          aria-current={current === t.key ? "page" : undefined}
          className={`-mb-px border-b-2 px-3 py-2 text-sm font-medium ${current === t.key ? "border-lake text-ink" : "border-transparent text-ink-2 hover:text-ink"}`}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}
