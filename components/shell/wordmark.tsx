import Link from "next/link";

/** Our mark: a span between two supports with its dashed deflected shape. */
export function Wordmark({ href = "/" }: { href?: string }) {
  return (
    <Link href={href} className="flex items-center gap-2 text-ink no-underline" aria-label="Spanproof home">
      <svg width="34" height="20" viewBox="0 0 34 20" aria-hidden="true">
        <line x1="3" y1="7" x2="31" y2="7" stroke="currentColor" strokeWidth="2" />
        <path d="M3 7 Q17 15 31 7" fill="none" stroke="var(--color-accent)" strokeWidth="1.5" strokeDasharray="2.5 2" />
        <path d="M3 7 L0 12 L6 12 Z" fill="currentColor" />
        <circle cx="31" cy="10" r="2.3" fill="none" stroke="currentColor" strokeWidth="1.3" />
        <line x1="27" y1="13.5" x2="34" y2="13.5" stroke="currentColor" strokeWidth="1.3" />
      </svg>
      <span className="text-lg font-semibold tracking-tight">Spanproof</span>
    </Link>
  );
}
