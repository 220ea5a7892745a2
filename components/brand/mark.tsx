/**
 * Strutroom's mark: one module of a double-layer grid seen from above — the top-chord square, the offset
 * bottom node and its four diagonals — drawn in the tension and compression colours.
 */
export function StrutroomMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} role="img" aria-label="Strutroom">
      <rect x="4" y="4" width="24" height="24" rx="3" fill="none" stroke="#0f766e" strokeWidth="2.5" />
      <path d="M4 4 16 16 28 4M4 28 16 16 28 28" fill="none" stroke="#c2410c" strokeWidth="1.75" strokeLinecap="round" />
      <circle cx="16" cy="16" r="3" fill="#262d29" />
    </svg>
  );
}

/** The mark with the product name beside it. */
export function StrutroomWordmark() {
  return (
    <span className="inline-flex items-center gap-2 text-lg font-semibold tracking-tight text-board-900">
      <StrutroomMark />
      Strutroom
    </span>
  );
}
