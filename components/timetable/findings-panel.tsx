'use client';

import { useState, type ReactNode } from 'react';
import { FINDING_KINDS, type Finding, type FindingKind } from '@/lib/planning/finding';
import { FINDING_LABELS, TIMING_KINDS } from '@/lib/sessions/highlight';
import { spanLabel, type SessionClock } from '@/lib/sessions/time-labels';
import { Button } from '@/components/ui/button';
import { Badge } from '@/components/ui/card';

/** A group longer than this is cut to its first entries until asked. */
const SHOWN_AT_FIRST = 20;
/** Groups of at most this many findings start open; longer ones start folded to their heading. */
const OPEN_UP_TO = 3;

export const findingKey = (f: Finding) => `${f.kind}:${f.ids.join(',')}:${f.fromS}`;

type Group = { kind: FindingKind; severity: Finding['severity']; findings: Finding[] };

/** Findings by kind: errors first, then warnings, each in the engine's kind order; within a kind, by time. */
export function groupFindings(findings: readonly Finding[]): Group[] {
  const byKind = new Map<FindingKind, Finding[]>();
  for (const f of findings) {
    const list = byKind.get(f.kind);
    if (list) list.push(f);
    else byKind.set(f.kind, [f]);
  }
  const groups: Group[] = [];
  for (const severity of ['error', 'warning'] as const) {
    for (const kind of FINDING_KINDS) {
      const list = byKind.get(kind)?.filter((f) => f.severity === severity);
      if (list?.length) groups.push({ kind, severity, findings: list });
    }
  }
  return groups;
}

/**
 * The engine's findings in plain words, grouped by kind with a count on each group (a long group
 * folds to its heading), each finding with its time on the fast and the real clock. Choosing one
 * marks what it is about on every view.
 */
export function FindingsPanel({
  findings,
  counts,
  totals,
  truncated = false,
  clock,
  selectedKey,
  onSelect,
  repair,
  canEdit,
  checking,
  checkMs,
  roundTripMs,
  revision,
}: {
  findings: Finding[];
  /** Findings of each kind, listed or not (the engine lists a capped number). */
  counts?: Partial<Record<FindingKind, number>>;
  /** Errors and warnings counted, listed or not. */
  totals?: { errors: number; warnings: number };
  truncated?: boolean;
  clock: SessionClock;
  selectedKey?: string;
  onSelect: (finding: Finding | undefined) => void;
  /** The control that opens the timing repair (shown when there are timing clashes). */
  repair?: ReactNode;
  canEdit: boolean;
  checking: boolean;
  checkMs: number;
  roundTripMs?: number;
  revision: number;
}) {
  const errors = findings.filter((f) => f.severity === 'error');
  const warnings = findings.length - errors.length;
  // The badges count every finding, also those past the engine's caps that are not listed.
  const total = totals ?? { errors: errors.length, warnings };
  const timing = errors.filter((f) => TIMING_KINDS.has(f.kind)).length;
  const groups = groupFindings(findings);
  // Folded or unfolded by hand, per kind; otherwise a group starts open when it is short.
  const [folded, setFolded] = useState<Partial<Record<FindingKind, boolean>>>({});
  const [showAll, setShowAll] = useState<Partial<Record<FindingKind, boolean>>>({});
  return (
    <section className="rounded-plate border border-line bg-surface p-4 shadow-sm" aria-labelledby="findings-title" data-testid="findings-panel">
      <header className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id="findings-title" className="font-display text-lg font-bold">Findings</h2>
        <div className="flex items-center gap-2 text-xs" aria-live="polite">
          <Badge tone={total.errors ? 'bad' : 'good'}>
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
      {canEdit && timing > 0 && repair ? (
        <div className="mb-3 rounded-plate bg-signal-soft p-3 text-sm">
          <p className="mb-2 text-signal">
            {timing} timing clash{timing === 1 ? '' : 'es'} (blocks or bookings). Repair timing delays the fewest seconds it can.
          </p>
          {repair}
        </div>
      ) : null}
      {findings.length === 0 ? (
        <p className="text-sm text-muted" data-testid="no-findings">No clashes or overloads: the timetable checks out.</p>
      ) : (
        <div className="space-y-2" data-testid="finding-list">
          {groups.map((group) => {
            const count = Math.max(counts?.[group.kind] ?? 0, group.findings.length);
            const holdsSelected = selectedKey !== undefined && group.findings.some((f) => findingKey(f) === selectedKey);
            const open = holdsSelected || (folded[group.kind] === undefined ? count <= OPEN_UP_TO : !folded[group.kind]);
            const all = showAll[group.kind] || group.findings.length <= SHOWN_AT_FIRST;
            const shown = all ? group.findings : group.findings.slice(0, SHOWN_AT_FIRST);
            const list = !all && holdsSelected && !shown.some((f) => findingKey(f) === selectedKey)
              ? [...shown, ...group.findings.filter((f) => findingKey(f) === selectedKey)]
              : shown;
            return (
              <details
                key={`${group.severity}:${group.kind}`}
                open={open}
                onToggle={(e) => {
                  const nowOpen = e.currentTarget.open;
                  if (nowOpen !== open) setFolded((s) => ({ ...s, [group.kind]: !nowOpen }));
                }}
                className="rounded-plate border border-line"
                data-testid="finding-group"
                data-kind={group.kind}
              >
                <summary className="flex cursor-pointer list-none items-center gap-2 rounded-plate px-3 py-2 text-sm hover:bg-sunken [&::-webkit-details-marker]:hidden">
                  <span aria-hidden className={`inline-block w-3 text-muted transition-transform ${open ? 'rotate-90' : ''}`}>▸</span>
                  <Badge tone={group.severity === 'error' ? 'bad' : 'warn'}>{group.severity}</Badge>
                  <span className="flex-1 font-semibold">{FINDING_LABELS[group.kind]}</span>
                  <span className="tabular-nums text-muted" data-testid="finding-group-count">{count}</span>
                </summary>
                <ol className="space-y-2 px-2 pb-2">
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
                          <span className="block">{f.message}.</span>
                          <span className="mt-1 block text-xs text-muted">{spanLabel(f.fromS, f.toS, clock)}</span>
                        </button>
                      </li>
                    );
                  })}
                </ol>
                {group.findings.length > list.length ? (
                  <Button type="button" variant="ghost" className="mb-2 w-full" onClick={() => setShowAll((s) => ({ ...s, [group.kind]: true }))}>
                    Show all {group.findings.length}
                  </Button>
                ) : null}
              </details>
            );
          })}
        </div>
      )}
    </section>
  );
}
