import Link from "next/link";

/** Tareline's wordmark: a balance pan line over the name, in copper. */
export function Wordmark({ href = "/" }: { href?: string }) {
  return (
    <Link href={href} className="flex items-center gap-2 text-ink no-underline hover:no-underline" aria-label="Tareline home">
      <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true">
        <path d="M3 15 h16" stroke="#a8592e" strokeWidth="2" strokeLinecap="round" />
        <path d="M11 15 V5 M6 5 h10" stroke="#2a2a2d" strokeWidth="1.6" strokeLinecap="round" />
        <circle cx="11" cy="18.5" r="1.5" fill="#a8592e" />
      </svg>
      <span className="text-lg font-semibold tracking-tight">Tareline</span>
    </Link>
  );
}
