// Chainproof's mark: two links of a chain closed by a tick, drawn for this product.
export function LogoMark({ className = "h-8 w-8" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect x="2" y="9" width="17" height="14" rx="7" fill="none" stroke="currentColor" strokeWidth="3" />
      <rect x="13" y="9" width="17" height="14" rx="7" fill="none" stroke="#c8692a" strokeWidth="3" />
      <path d="M11 16.5l3 3 6-7" fill="none" stroke="currentColor" strokeWidth="2.6" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

export function Logo({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${className}`}>
      <LogoMark />
      <span className="text-lg">Chainproof</span>
    </span>
  );
}
