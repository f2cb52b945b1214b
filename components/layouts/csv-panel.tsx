'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { Button, buttonClass } from '@/components/ui/button';
import { Badge, Notice } from '@/components/ui/card';
import { inputClass } from '@/components/ui/field';
import { ApiError, apiCall, errorMessage } from '@/lib/client/api';
import { CSV_COLUMNS, type CsvIssue } from '@/lib/layouts/csv';
import { CSV_MAX_BYTES, type CsvTable } from '@/lib/validations/layout';

type Preview = {
  rows: { row: number; label: string; action: 'create' | 'update' | 'unchanged' | 'error' }[];
  issues: CsvIssue[];
  counts: { create: number; update: number; unchanged: number; error: number };
  basis: string;
};

const ACTION_TONE = { create: 'good', update: 'info', unchanged: 'neutral', error: 'bad' } as const;
const ACTION_LABEL = { create: 'new', update: 'changes', unchanged: 'same', error: 'error' } as const;

/**
 * Export one table as CSV, or import one: choose a file (or paste), check it — every problem is
 * listed by row and column and nothing is written — fix it here, then import it all at once.
 */
export function CsvPanel({ layoutId, table, canEdit }: { layoutId: string; table: CsvTable; canEdit: boolean }) {
  const router = useRouter();
  const [text, setText] = useState('');
  const [preview, setPreview] = useState<Preview | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  const url = `/api/layouts/${layoutId}/csv/${table}`;
  const columns = CSV_COLUMNS[table];

  const send = (mode: 'preview' | 'commit') =>
    startTransition(async () => {
      setMessage(null);
      const query = mode === 'preview' ? '?mode=preview' : `?mode=commit&basis=${encodeURIComponent(preview?.basis ?? '')}`;
      let body: Preview;
      try {
        body = await apiCall<Preview>('POST', `${url}${query}`, { body: { text, contentType: 'text/csv' } });
      } catch (error) {
        const stale = error instanceof ApiError && error.status === 409;
        setMessage({ ok: false, text: stale ? 'The table changed since you checked the file. Check it again.' : errorMessage(error) });
        if (stale) setPreview(null);
        return;
      }
      if (mode === 'preview') {
        setPreview(body);
        return;
      }
      const c = body.counts as Preview['counts'];
      setMessage({ ok: true, text: `Imported: ${c.create} new, ${c.update} changed, ${c.unchanged} unchanged.` });
      setPreview(null);
      setText('');
      router.refresh();
    });

  const readFile = async (file: File | undefined) => {
    setPreview(null);
    setMessage(null);
    if (!file) return;
    if (file.size > CSV_MAX_BYTES) {
      setMessage({ ok: false, text: `The file is ${(file.size / 1_000_000).toFixed(1)} MB; the limit is 1 MB. Split it into smaller files.` });
      return;
    }
    setText(await file.text());
  };

  return (
    <div className="space-y-3" data-testid={`csv-${table}`}>
      <div className="flex flex-wrap items-center gap-2">
        <a href={url} className={buttonClass('secondary')} download>
          Export {table} (CSV)
        </a>
      </div>
      {canEdit ? (
        <details className="rounded-plate border border-line p-3" open={text !== '' || undefined}>
          <summary className="cursor-pointer text-sm font-semibold">Import {table} from CSV</summary>
          <div className="mt-3 space-y-3">
            <p className="text-xs text-muted">
              Columns: {columns.map((c) => `${c.name}${c.required ? '' : ' (optional)'} — ${c.help}`).join('; ')}. Rows whose name matches an
              existing one update it; others are added; nothing is deleted. Up to 1 MB and 5 000 rows. Row numbers count the header as row 1, as a spreadsheet does.
            </p>
            <label className="block text-sm font-semibold">
              CSV file
              <input type="file" accept=".csv,text/csv" onChange={(e) => void readFile(e.target.files?.[0])} className="mt-1 block text-sm" aria-label={`CSV file of ${table}`} />
            </label>
            <label className="block text-sm font-semibold" htmlFor={`csv-text-${table}`}>
              Or paste, and fix here
            </label>
            <textarea
              id={`csv-text-${table}`}
              value={text}
              onChange={(e) => {
                setText(e.target.value);
                setPreview(null);
              }}
              rows={Math.min(12, Math.max(4, text.split('\n').length + 1))}
              className={`${inputClass} font-mono text-xs`}
              placeholder={columns.map((c) => c.name).join(',')}
              spellCheck={false}
            />
            <div className="flex flex-wrap gap-2">
              <Button type="button" variant="secondary" onClick={() => send('preview')} disabled={pending || text.trim() === ''}>
                {pending ? 'Checking…' : 'Check file'}
              </Button>
              {preview && preview.issues.length === 0 ? (
                <Button type="button" onClick={() => send('commit')} disabled={pending}>
                  Import {preview.counts.create + preview.counts.update} row{preview.counts.create + preview.counts.update === 1 ? '' : 's'}
                </Button>
              ) : null}
            </div>
            {message ? <Notice tone={message.ok ? 'good' : 'bad'}>{message.text}</Notice> : null}
            {preview ? <PreviewView preview={preview} /> : null}
          </div>
        </details>
      ) : null}
    </div>
  );
}

function PreviewView({ preview }: { preview: Preview }) {
  const { counts, issues } = preview;
  return (
    <div className="space-y-3" data-testid="csv-preview">
      <p className="text-sm">
        {counts.create} new · {counts.update} changed · {counts.unchanged} unchanged
        {counts.error ? ` · ${counts.error} with errors` : ''}
      </p>
      {issues.length ? (
        <>
          <Notice tone="bad">
            Nothing will be imported until every row is right: {issues.length} problem{issues.length === 1 ? '' : 's'}. Fix {issues.length === 1 ? 'it' : 'them'} above and check again.
          </Notice>
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" data-testid="csv-issues">
              <thead className="text-xs uppercase text-muted">
                <tr>
                  <th className="px-2 py-1">Row</th>
                  <th className="px-2 py-1">Column</th>
                  <th className="px-2 py-1">Problem</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {issues.slice(0, 200).map((i, n) => (
                  <tr key={n}>
                    <td className="px-2 py-1 font-semibold">Row {i.row}</td>
                    <td className="px-2 py-1">{i.column || '—'}</td>
                    <td className="px-2 py-1 text-signal">{i.message}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            {issues.length > 200 ? <p className="text-xs text-muted">…and {issues.length - 200} more.</p> : null}
          </div>
        </>
      ) : null}
      {preview.rows.length ? (
        <ul className="flex max-h-48 flex-wrap gap-1 overflow-y-auto text-xs">
          {preview.rows.slice(0, 300).map((r) => (
            <li key={r.row}>
              <Badge tone={ACTION_TONE[r.action]}>
                {r.row}: {r.label || '—'} ({ACTION_LABEL[r.action]})
              </Badge>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
