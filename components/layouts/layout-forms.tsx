'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { useForm } from 'react-hook-form';
import { createLayout, deleteLayout, updateLayout } from '@/app/(app)/railways/[railwayId]/layouts/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, inputClass } from '@/components/ui/field';
import { ApiError, apiCall, errorMessage } from '@/lib/client/api';
import type { ActionState } from '@/lib/errors';
import { SCALES } from '@/lib/planning';
import { CUSTOM_SCALE, layoutFields } from '@/lib/validations/layout';

type Values = { name: string; scaleId: string; customScaleName: string; customRatio: string; setting: string; notes: string };

/** Create a layout, or edit its name, scale (from the scale table or an own ratio), setting and notes. */
export function LayoutForm({
  railwayId,
  layout,
}: {
  railwayId: string;
  layout?: { id: string; version: number; values: Values };
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const form = useForm<Values>({
    resolver: zodResolver(layoutFields as never, undefined, { raw: true }) as never,
    defaultValues: layout?.values ?? { name: '', scaleId: 'h0-nem', customScaleName: '', customRatio: '', setting: 'indoor', notes: '' },
  });
  const errors = form.formState.errors;
  const custom = form.watch('scaleId') === CUSTOM_SCALE;
  const submit = form.handleSubmit((values) =>
    startTransition(async () => {
      setMessage(null);
      const data = new FormData();
      for (const [k, v] of Object.entries(values)) data.set(k, v ?? '');
      let state: ActionState<{ id: string }>;
      if (layout) {
        data.set('version', String(layout.version));
        state = await updateLayout(railwayId, layout.id, null, data);
      } else state = await createLayout(railwayId, null, data);
      if (state?.ok) {
        if (!layout && state.data) router.push(`/railways/${railwayId}/layouts/${state.data.id}/track`);
        else {
          setMessage({ ok: true, text: state.message ?? 'Saved.' });
          router.refresh();
        }
      } else if (state) {
        for (const [k, v] of Object.entries(state.fieldErrors ?? {})) form.setError(k as keyof Values, { message: v });
        if (!Object.keys(state.fieldErrors ?? {}).length) setMessage({ ok: false, text: state.error });
      }
    }),
  );
  const id = (n: string) => `${layout ? 'edit' : 'new'}-layout-${n}`;
  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <Field label="Name" name={id('name')} error={errors.name?.message}>
        <input id={id('name')} {...form.register('name')} className={inputClass} aria-invalid={errors.name ? true : undefined} placeholder="e.g. Attic branch line" />
      </Field>
      {/* One field a line: the scale's label (name, ratio and gauge) needs the card's whole width. */}
      <div className="space-y-4">
        <Field label="Scale" name={id('scale')} error={errors.scaleId?.message} hint="Ratios and gauges from NEM 010 and NMRA S-1.2.">
          <select id={id('scale')} {...form.register('scaleId')} className={inputClass}>
            {SCALES.map((s) => (
              <option key={s.id} value={s.id}>
                {s.label} — 1:{s.ratio}, {s.gaugeMm} mm
              </option>
            ))}
            <option value={CUSTOM_SCALE}>Own ratio…</option>
          </select>
        </Field>
        <Field label="Setting" name={id('setting')} error={errors.setting?.message}>
          <select id={id('setting')} {...form.register('setting')} className={inputClass}>
            <option value="indoor">Indoor</option>
            <option value="outdoor">Outdoor</option>
          </select>
        </Field>
      </div>
      {custom ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Scale name" name={id('customScaleName')} error={errors.customScaleName?.message}>
            <input id={id('customScaleName')} {...form.register('customScaleName')} className={inputClass} aria-invalid={errors.customScaleName ? true : undefined} />
          </Field>
          <Field label="Ratio (1 : …)" name={id('customRatio')} error={errors.customRatio?.message}>
            <input id={id('customRatio')} {...form.register('customRatio')} inputMode="decimal" className={inputClass} aria-invalid={errors.customRatio ? true : undefined} />
          </Field>
        </div>
      ) : null}
      <Field label="Notes" name={id('notes')} error={errors.notes?.message}>
        <textarea id={id('notes')} {...form.register('notes')} rows={3} className={inputClass} />
      </Field>
      {message ? <Notice tone={message.ok ? 'good' : 'bad'}>{message.text}</Notice> : null}
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : layout ? 'Save layout' : 'Create layout'}
      </Button>
    </form>
  );
}

export function DeleteLayoutButton({ railwayId, layoutId, version, name }: { railwayId: string; layoutId: string; version: number; name: string }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-2">
      <Button
        type="button"
        variant="danger"
        disabled={pending}
        onClick={() => {
          if (!window.confirm(`Delete “${name}” with all its blocks, power and rolling stock?`)) return;
          startTransition(async () => {
            const data = new FormData();
            data.set('version', String(version));
            const state = await deleteLayout(railwayId, layoutId, null, data);
            if (state?.ok) router.push(`/railways/${railwayId}/layouts`);
            else if (state) setError(state.error);
          });
        }}
      >
        Delete layout
      </Button>
      {error ? <Notice tone="bad">{error}</Notice> : null}
    </div>
  );
}

/** A plan interchange file (JSON, version 1) becomes a new layout. */
export function PlanImportForm({ railwayId }: { railwayId: string }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ ok: boolean; text: string; issues?: { path: string; message: string }[] } | null>(null);
  const [file, setFile] = useState<File | null>(null);
  const [name, setName] = useState('');
  const submit = () =>
    startTransition(async () => {
      setMessage(null);
      if (!file) return setMessage({ ok: false, text: 'Choose a plan file (.json).' });
      if (file.size > 2_000_000) return setMessage({ ok: false, text: 'The file is over 2 MB; the limit is 2 MB.' });
      let plan: unknown;
      try {
        plan = JSON.parse(await file.text());
      } catch {
        return setMessage({ ok: false, text: 'This file is not valid JSON.' });
      }
      try {
        const created = await apiCall<{ id: string }>('POST', '/api/layouts/import', { body: { json: { railwayId, name: name || undefined, plan } } });
        router.push(`/railways/${railwayId}/layouts/${created.id}`);
      } catch (error) {
        setMessage({ ok: false, text: errorMessage(error), issues: error instanceof ApiError ? error.body.issues : undefined });
      }
    });
  return (
    <div className="space-y-3">
      <label className="block text-sm font-semibold">
        Plan file (JSON)
        <input type="file" accept=".json,application/json" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="mt-1 block text-sm font-normal" />
      </label>
      <Field label="Name (optional)" name="plan-import-name" hint="Blank keeps the name in the file.">
        <input id="plan-import-name" value={name} onChange={(e) => setName(e.target.value)} className={inputClass} />
      </Field>
      <Button type="button" variant="secondary" onClick={submit} disabled={pending}>
        {pending ? 'Importing…' : 'Import as a new layout'}
      </Button>
      {message ? (
        <Notice tone={message.ok ? 'good' : 'bad'}>
          {message.text}
          {message.issues && message.issues.length > 1 ? (
            <ul className="mt-2 list-inside list-disc text-xs">
              {message.issues.slice(0, 10).map((i, n) => (
                <li key={n}>
                  {i.path}: {i.message}
                </li>
              ))}
            </ul>
          ) : null}
        </Notice>
      ) : null}
    </div>
  );
}
