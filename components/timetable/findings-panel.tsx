'use client';

import { useState } from 'react';
import type { Finding } from '@/lib/planning';
import { FINDING_LABELS, TIMING_KINDS } from '@/lib/sessions/highlight';
import { spanLabel, type SessionClock } from '@/lib/sessions/time-labels';
import { Button } from '@/components/ui/button';
import { Badge } from '@/components/ui/card';

const SHOWN_AT_FIRST = 40;

export const findingKey = (f: Finding) => `${f.kind}:${f.ids.join(',')}:${f.fromS}`;

/**
 * The engine's findings in plain words: errors first, then warnings, each with its time on the
 * fast and the real clock. Choosing one marks what it is about on every view.
 */
export function FindingsPanel({
  findings,
  totals,
  truncated = false,
  clock,
  selectedKey,
  onSelect,
  onRepair,
  canEdit,
  checking,
  checkMs,
  roundTripMs,
  revision,
}: {
  findings: Finding[];
  /** Errors and warnings counted, listed or not (the engine lists a capped number). */
  totals?: { errors: number; warnings: number };
  truncated?: boolean;
  clock: SessionClock;
  selectedKey?: string;
  onSelect: (finding: Finding | undefined) => void;
  onRepair: () => void;
  canEdit: boolean;
  checking: boolean;
  checkMs: number;
  roundTripMs?: number;
  revision: number;
}) {
  const errors = findings.filter((f) => f.severity === 'error');
  const warnings = findings.filter((f) => f.severity === 'warning');
  // The badges count every finding, also those past the engine's caps that are not listed.
  const total = totals ?? { errors: errors.length, warnings: warnings.length };
  const timing = errors.filter((f) => TIMING_KINDS.has(f.kind)).length;
  const [showAll, setShowAll] = useState(false);
  const ordered = [...errors, ...warnings];
  // A long list (hundreds of clashes in a rough first draft) is cut to its first entries until asked.
  const shown = showAll || ordered.length <= SHOWN_AT_FIRST ? ordered : ordered.slice(0, SHOWN_AT_FIRST);
  const selectedHidden = selectedKey !== undefined && !shown.some((f) => findingKey(f) === selectedKey);
  const list = selectedHidden ? [...shown, ...ordered.filter((f) => findingKey(f) === selectedKey)] : shown;
  return (
    <section className="rounded-plate border border-line bg-surface p-4 shadow-sm" aria-labelledby="findings-title" data-testid="findings-panel">
      <header className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id="findings-title" className="font-display text-lg font-bold">Findings</h2>
        <div className="flex items-center gap-2 text-xs" aria-live="polite">
          <Badge tone={errors.length ? 'bad' : 'good'}>
            <span data-testid="error-count">{total.errors}</span>&nbsp;error{total.errors === 1 ? '' : 's'}
          </Badge>
          <Badge tone={total.warnings ? 'warn' : 'neutral'}>
            {total.warnings} warning{total.warnings === 1 ? '' : 's'}
          </Badge>
        </div>
      </header>
      <p className="mb-3 text-xs text-muted" data-testid="check-status" data-revision={revision} data-checking={checking ? 'true' : 'false'}>
        {checking ? 'Checking…' : `Checked on the server in ${checkMs} ms${roundTripMs !== undefined ? `; last change answered in ${roundTripMs} ms` : ''}.`}
      </p>
      {truncated ? (
        <p className="mb-3 rounded-plate bg-signal-soft p-3 text-sm text-signal" data-testid="findings-truncated">
          Only the first {findings.length} of {total.errors + total.warnings} findings are listed: fix these, and the rest follow.
        </p>
      ) : null}
      {canEdit && timing > 0 ? (
        <div className="mb-3 rounded-plate bg-signal-soft p-3 text-sm">
          <p className="mb-2 text-signal">
            {timing} timing clash{timing === 1 ? '' : 'es'} (blocks or bookings). Repair timing delays the fewest seconds it can.
          </p>
          <Button type="button" onClick={onRepair} data-testid="repair-timing">Repair timing…</Button>
        </div>
      ) : null}
      {findings.length === 0 ? (
        <p className="text-sm text-muted" data-testid="no-findings">No clashes or overloads: the timetable checks out.</p>
      ) : (
        <ol className="max-h-[32rem] space-y-2 overflow-y-auto pr-1" data-testid="finding-list">
          {list.map((f) => {
            const key = findingKey(f);
            const selected = key === selectedKey;
            return (
              <li key={key}>
                <button
                  type="button"
                  onClick={() => onSelect(selected ? undefined : f)}
                  aria-pressed={selected}
                  data-testid="finding"
                  data-kind={f.kind}
                  data-severity={f.severity}
                  className={`w-full rounded-plate border p-3 text-left text-sm transition-colors ${
                    selected ? 'border-brass bg-brass-soft' : 'border-line hover:bg-sunken'
                  }`}
                >
                  <span className="mb-1 flex items-center gap-2">
                    <Badge tone={f.severity === 'error' ? 'bad' : 'warn'}>{f.severity}</Badge>
                    <span className="font-semibold">{FINDING_LABELS[f.kind]}</span>
                  </span>
                  <span className="block">{f.message}.</span>
                  <span className="mt-1 block text-xs text-muted">{spanLabel(f.fromS, f.toS, clock)}</span>
                </button>
              </li>
            );
          })}
        </ol>
      )}
      {ordered.length > list.length ? (
        <Button type="button" variant="ghost" className="mt-2 w-full" onClick={() => setShowAll(true)}>
          Show all {ordered.length} findings
        </Button>
      ) : null}
    </section>
  );
}
