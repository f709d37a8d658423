// Kitwright's mark: three stepped bars (velocity layers) inside a rounded square. Our own design.
export function Logo({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="1" y="1" width="30" height="30" rx="7" fill="#1f5f5b" />
      <rect x="7" y="18" width="4" height="7" rx="1" fill="#f5f3ee" />
      <rect x="14" y="13" width="4" height="12" rx="1" fill="#f5f3ee" />
      <rect x="21" y="7" width="4" height="18" rx="1" fill="#e9b44c" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 text-lg font-semibold tracking-tight text-ink">
      <Logo /> Kitwright
    </span>
  );
}
