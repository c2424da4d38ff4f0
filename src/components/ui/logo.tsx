export function Logo({ className = 'h-6 w-6' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <path d="M4 26a12 12 0 0 1 24 0" fill="none" stroke="currentColor" strokeWidth="2.5" />
      <path d="M16 26 9 15M16 26l7-11M16 26V12" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
    </svg>
  );
}
