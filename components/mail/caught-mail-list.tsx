import type { ReactNode } from 'react';
import { MailText } from '@/components/mail/mail-text';

/** One caught message as a list shows it: `meta` is the line under the subject (time, recipients). */
export type CaughtMailItem = { id: string; subject: string; meta: ReactNode; text: string };

/** Caught messages, each opening to its text with the links live, or a line saying there are none yet. */
export function CaughtMailList({ items, testId }: { items: CaughtMailItem[]; testId: string }) {
  if (items.length === 0) {
    return <p className="text-sm text-muted">Nothing yet. Messages appear here a second or two after they are sent.</p>;
  }
  return (
    <ul className="space-y-3" data-testid={testId}>
      {items.map((m) => (
        <li key={m.id} className="rounded-plate border border-line">
          <details>
            <summary className="cursor-pointer p-3">
              <span className="font-semibold">{m.subject}</span>
              <span className="block text-xs text-muted">{m.meta}</span>
            </summary>
            <div className="border-t border-line p-3">
              <pre className="whitespace-pre-wrap break-words font-sans text-sm">
                <MailText text={m.text} />
              </pre>
            </div>
          </details>
        </li>
      ))}
    </ul>
  );
}
