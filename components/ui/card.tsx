import type { ReactNode } from 'react';

export function Card({ title, action, children, className = '' }: { title?: ReactNode; action?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-plate border border-line bg-surface p-4 shadow-sm sm:p-5 ${className}`}>
      {title || action ? (
        <header className="mb-3 flex items-center justify-between gap-3">
          {title ? <h2 className="font-display text-lg font-bold text-ink">{title}</h2> : <span />}
          {action}
        </header>
      ) : null}
      {children}
    </section>
  );
}

export function CardSkeleton({ lines = 3 }: { lines?: number }) {
  return (
    <div className="animate-pulse rounded-plate border border-line bg-surface p-5" aria-hidden>
      <div className="mb-4 h-5 w-1/3 rounded bg-sunken" />
      {Array.from({ length: lines }, (_, i) => (
        <div key={i} className="mb-2 h-4 rounded bg-sunken" style={{ width: `${90 - i * 12}%` }} />
      ))}
    </div>
  );
}

type Tone = 'neutral' | 'good' | 'warn' | 'bad' | 'info';
const TONES: Record<Tone, string> = {
  neutral: 'bg-sunken text-muted',
  good: 'bg-verdigris-soft text-verdigris-strong',
  warn: 'bg-amber-soft text-amber',
  bad: 'bg-signal-soft text-signal',
  info: 'bg-brass-soft text-brass',
};

export function Badge({ tone = 'neutral', children }: { tone?: Tone; children: ReactNode }) {
  return (
    <span className={`inline-flex items-center rounded-full px-2 py-0.5 text-xs font-semibold ${TONES[tone]}`}>
      {children}
    </span>
  );
}

export function Notice({ tone = 'info', children }: { tone?: Tone; children: ReactNode }) {
  return <div className={`rounded-plate px-4 py-3 text-sm ${TONES[tone]}`} role={tone === 'bad' ? 'alert' : 'status'}>{children}</div>;
}
