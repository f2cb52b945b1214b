/**
 * Fishplate's mark: two rail ends meeting at a joint, held by a plate with four bolts.
 */
export function LogoMark({ className = 'h-8 w-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 48 48" className={className} role="img" aria-label="Fishplate logo">
      <rect x="1" y="1" width="46" height="46" rx="11" fill="var(--verdigris)" />
      <rect x="4" y="20" width="18.5" height="8" rx="1.5" fill="var(--paper)" opacity="0.55" />
      <rect x="25.5" y="20" width="18.5" height="8" rx="1.5" fill="var(--paper)" opacity="0.55" />
      <rect x="9" y="16" width="30" height="16" rx="4" fill="var(--brass)" />
      {[14.5, 20.5, 27.5, 33.5].map((cx) => (
        <circle key={cx} cx={cx} cy="24" r="2.5" fill="var(--paper)" />
      ))}
    </svg>
  );
}

export function Wordmark({ className = '' }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <LogoMark />
      <span className="font-display text-xl font-bold tracking-tight text-ink">
        fish<span className="text-verdigris">plate</span>
      </span>
    </span>
  );
}
