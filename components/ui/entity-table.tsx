'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useRef, useState, useTransition, type ReactNode } from 'react';
import { Controller, useForm, type UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';
import { inputClass as fieldClass } from '@/components/ui/field';

// Table cells size their inputs themselves, so the form-wide full width is dropped.
const inputClass = fieldClass.replace('w-full ', '');
import type { ActionState } from '@/lib/errors';
import { DataTable, STICKY_END } from './data-table';

export type FormValues = Record<string, string | string[]>;

export type FieldSpec<T> = {
  name: string;
  kind?: 'text' | 'number' | 'select' | 'consist';
  options?: { value: string; label: string }[];
  placeholder?: string;
  suffix?: string;
  width?: string;
  toInput: (row: T) => string | string[];
};

export type EntityColumn<T> = {
  id: string;
  header: string;
  sortValue: (row: T) => string | number;
  field?: FieldSpec<T>;
  render?: (row: T) => ReactNode;
  /**
   * Drawn on a second line under the row's main cells, labelled, instead of in a column of its own:
   * a table with many fields then keeps within its card at laptop width, Add button in sight.
   */
  under?: boolean;
};

type Submit = (formData: FormData) => Promise<ActionState>;

type Props<T extends { id: string; version?: number }> = {
  label: string;
  noun: string;
  rows: T[];
  columns: EntityColumn<T>[];
  createSchema: z.ZodType;
  editSchema: z.ZodType;
  hidden?: Record<string, string>;
  newDefaults: FormValues;
  /** The add row takes changed newDefaults while it is untouched (they depend on other rows). */
  followDefaults?: boolean;
  /** The add row's values after an add, e.g. the next block's position. */
  nextDefaults?: (added: FormValues) => FormValues;
  create: Submit;
  update?: Submit;
  remove: Submit;
  canEdit: boolean;
  rowName: (row: T) => string;
  onFieldChange?: (name: string, value: unknown, form: UseFormReturn<FormValues>) => void;
  testId: string;
  pageSize?: number;
};

function toFormData(values: FormValues): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) {
    if (Array.isArray(value)) for (const v of value) data.append(key, v);
    else data.set(key, value === null || value === undefined ? '' : String(value));
  }
  return data;
}

/**
 * A table whose rows are forms: type in a cell, press Enter (or Save) and the row is saved through
 * its server action. The typed value stays on screen while the save runs (the edit feels instant);
 * a refusal puts the message under the field, and a stale edit (409) says so and offers a reload.
 * The first row adds a new entry and keeps the keyboard in place for the next one.
 */
export function EntityTable<T extends { id: string; version?: number }>(props: Props<T>) {
  const { rows, columns, canEdit, label, testId } = props;
  const [removed, setRemoved] = useState<Set<string>>(new Set());
  const visible = useMemo(() => rows.filter((r) => !removed.has(r.id)), [rows, removed]);
  const underIds = useMemo(() => columns.filter((c) => c.under).map((c) => c.id), [columns]);
  const tableColumns = useMemo<ColumnDef<T, unknown>[]>(
    () => [
      ...columns.map((c) => ({
        id: c.id,
        header: c.header,
        accessorFn: (row: T) => c.sortValue(row),
        enableSorting: true,
      })),
      ...(canEdit ? [{ id: 'actions', header: '', enableSorting: false, enableGlobalFilter: false }] : []),
    ],
    [columns, canEdit],
  );
  return (
    <DataTable
      data={visible}
      columns={tableColumns}
      label={label}
      testId={testId}
      pageSize={props.pageSize}
      hiddenColumns={underIds}
      wrap={underIds.length > 0}
      empty={canEdit ? `No ${label} yet: type the first one in the row above.` : `No ${label} yet.`}
      before={canEdit ? <RowForm {...props} mode="create" /> : null}
      renderRow={(r) => (
        <RowForm
          key={r.original.id}
          {...props}
          mode="edit"
          row={r.original}
          onRemoved={(id, back) =>
            setRemoved((s) => {
              const next = new Set(s);
              if (back) next.delete(id);
              else next.add(id);
              return next;
            })
          }
        />
      )}
    />
  );
}

function RowForm<T extends { id: string; version?: number }>({
  mode,
  row,
  columns,
  createSchema,
  editSchema,
  hidden = {},
  newDefaults,
  followDefaults,
  nextDefaults,
  create,
  update,
  remove,
  canEdit,
  rowName,
  noun,
  onFieldChange,
  onRemoved,
}: Props<T> & { mode: 'create' | 'edit'; row?: T; onRemoved?: (id: string, back: boolean) => void }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [notice, setNotice] = useState<{ tone: 'bad' | 'good'; text: string; stale?: boolean } | null>(null);
  const firstInput = useRef<HTMLInputElement | null>(null);
  const defaults = useMemo<FormValues>(() => {
    if (mode === 'create' || !row) return { ...newDefaults, ...hidden };
    const values: FormValues = { id: row.id, ...(row.version !== undefined ? { version: String(row.version) } : {}), ...hidden };
    for (const c of columns) if (c.field) values[c.field.name] = c.field.toInput(row);
    return values;
  }, [mode, row, columns, newDefaults, hidden]);
  const form = useForm<FormValues>({
    resolver: zodResolver((mode === 'create' ? createSchema : editSchema) as never, undefined, { raw: true }) as never,
    defaultValues: defaults,
  });
  const resetKey = JSON.stringify(defaults);
  useEffect(() => {
    if (mode === 'edit') form.reset(defaults);
    // Reset when the stored row (its version) or the display unit changes, not on every render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [resetKey]);

  // With followDefaults the add row takes new defaults (a driver just added, say) until someone types in it.
  const newKey = JSON.stringify(newDefaults);
  useEffect(() => {
    if (mode === 'create' && followDefaults && !form.formState.isDirty) form.reset({ ...newDefaults, ...hidden });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [newKey]);

  const readOnly = !canEdit || (mode === 'edit' && !update);
  const dirty = form.formState.isDirty;
  const label = mode === 'create' ? `new ${noun}` : `${noun} ${row ? rowName(row) : ''}`;

  const save = form.handleSubmit((values) => {
    setNotice(null);
    const submit = mode === 'create' ? create : update;
    if (!submit) return;
    startTransition(async () => {
      const state = await submit(toFormData({ ...values, ...hidden }));
      if (state?.ok) {
        if (mode === 'create') {
          const next = nextDefaults ? nextDefaults(values) : newDefaults;
          form.reset({ ...next, ...hidden });
          setNotice({ tone: 'good', text: state.message ?? 'Added.' });
          firstInput.current?.focus();
        } else {
          form.reset(values);
        }
        router.refresh();
        return;
      }
      if (!state) return;
      const fields = Object.entries(state.fieldErrors ?? {});
      for (const [name, message] of fields) form.setError(name, { message });
      if (fields.length === 0 || !fields.some(([n]) => columns.some((c) => c.field?.name === n))) {
        setNotice({ tone: 'bad', text: state.error, stale: state.status === 409 });
      }
    });
  });

  const onDelete = () => {
    if (!row) return;
    setNotice(null);
    onRemoved?.(row.id, false);
    startTransition(async () => {
      const state = await remove(toFormData({ id: row.id, ...(row.version !== undefined ? { version: String(row.version) } : {}) }));
      if (state && !state.ok) {
        onRemoved?.(row.id, true);
        setNotice({ tone: 'bad', text: state.error, stale: state.status === 409 });
      } else router.refresh();
    });
  };

  /** A column's content: its input (or its value, read-only) with the field's error under it. */
  const contentOf = (c: EntityColumn<T>, i: number): ReactNode => {
    const f = c.field;
    if (!f || readOnly) return mode === 'edit' && row ? (c.render ? c.render(row) : f ? displayOf(f, row) : null) : null;
    const error = form.formState.errors[f.name]?.message;
    const id = `${noun}-${row?.id ?? 'new'}-${f.name}`;
    const common = {
      id,
      'aria-label': `${c.header} of ${label}`,
      'aria-invalid': error ? true : undefined,
      'aria-describedby': error ? `${id}-error` : undefined,
    } as const;
    let input: ReactNode;
    if (f.kind === 'select') {
      input = (
        <select {...common} {...form.register(f.name, { onChange: (e) => onFieldChange?.(f.name, e.target.value, form) })} className={`${inputClass} ${f.width ?? 'w-40'}`}>
          {f.options?.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      );
    } else if (f.kind === 'consist') {
      input = (
        <Controller
          control={form.control}
          name={f.name}
          render={({ field }) => (
            <ConsistPicker id={id} label={`${c.header} of ${label}`} value={(field.value as string[]) ?? []} onChange={field.onChange} options={f.options ?? []} invalid={!!error} />
          )}
        />
      );
    } else {
      const registered = form.register(f.name, { onChange: (e) => onFieldChange?.(f.name, e.target.value, form) });
      input = (
        <span className="flex items-center gap-1">
          <input
            {...common}
            {...registered}
            ref={(el) => {
              registered.ref(el);
              if (i === 0) firstInput.current = el;
            }}
            inputMode={f.kind === 'number' ? 'decimal' : undefined}
            autoComplete="off"
            placeholder={f.placeholder}
            className={`${inputClass} ${f.width ?? (f.kind === 'number' ? 'w-24' : 'w-48')}`}
          />
          {f.suffix ? <span className="text-xs text-muted">{f.suffix}</span> : null}
        </span>
      );
    }
    return (
      <>
        {input}
        {mode === 'edit' && row && c.render ? <div className="mt-1 text-xs text-muted">{c.render(row)}</div> : null}
        {error ? (
          <p id={`${id}-error`} role="alert" className="mt-1 max-w-56 text-xs text-signal">
            {error}
          </p>
        ) : null}
      </>
    );
  };
  const main = columns.filter((c) => !c.under);
  const under = columns.filter((c) => c.under);
  const width = main.length + (canEdit ? 1 : 0);
  const cells = main.map((c) => (
    <td key={c.id} className={`px-2 align-top ${c.field && !readOnly ? 'py-1.5' : 'py-2'}`}>
      {contentOf(c, columns.indexOf(c))}
    </td>
  ));
  // The columns drawn under the main cells: each with its heading as a visible label.
  const underRow = under.length ? (
    <tr>
      <td colSpan={width} className="px-2 pb-2">
        <div className="flex flex-wrap items-start gap-x-5 gap-y-2">
          {under.map((c) => (
            <div key={c.id} className="flex flex-col gap-0.5" data-column={c.id}>
              <span className="text-xs font-semibold uppercase tracking-wide text-muted" aria-hidden>
                {c.header}
              </span>
              <div className="text-sm">{contentOf(c, columns.indexOf(c))}</div>
            </div>
          ))}
        </div>
      </td>
    </tr>
  ) : null;

  // One entry is one <tbody>: its main row, the line of columns drawn under it, and its notice.
  return (
    <tbody
      className={`border-b border-line ${mode === 'create' ? 'bg-sunken/60' : dirty ? 'bg-brass-soft/40' : ''}`}
      data-testid={mode === 'create' ? `${noun}-new-row` : `${noun}-row`}
      onKeyDown={(e) => {
        if (e.key === 'Enter' && !readOnly && (e.target as HTMLElement).tagName !== 'BUTTON') {
          e.preventDefault();
          void save();
        }
      }}
    >
      <tr>
        {cells}
        {canEdit ? (
          <td className={`whitespace-nowrap px-2 py-1.5 text-right align-top ${STICKY_END} ${mode === 'create' ? 'bg-sunken' : dirty ? 'bg-brass-soft' : 'bg-surface'}`}>
            {mode === 'create' ? (
              <button type="button" onClick={() => void save()} disabled={pending} className="rounded-plate bg-verdigris px-3 py-2 text-sm font-semibold text-surface hover:bg-verdigris-strong disabled:opacity-60">
                {pending ? 'Adding…' : `Add ${noun}`}
              </button>
            ) : (
              <span className="inline-flex gap-1">
                {update ? (
                  <button type="button" onClick={() => void save()} disabled={pending || !dirty} className="rounded-plate border border-line px-3 py-2 text-sm font-semibold disabled:opacity-40" aria-label={`Save ${label}`}>
                    {pending ? 'Saving…' : 'Save'}
                  </button>
                ) : null}
                <button type="button" onClick={onDelete} disabled={pending} className="rounded-plate border border-signal/40 px-3 py-2 text-sm font-semibold text-signal hover:bg-signal-soft disabled:opacity-40" aria-label={`Delete ${label}`}>
                  Delete
                </button>
              </span>
            )}
          </td>
        ) : null}
      </tr>
      {underRow}
      {notice ? (
        <tr>
          <td colSpan={width} className="px-2 pb-2">
            <p role={notice.tone === 'bad' ? 'alert' : 'status'} className={`text-sm ${notice.tone === 'bad' ? 'text-signal' : 'text-verdigris-strong'}`}>
              {notice.text}{' '}
              {notice.stale ? (
                <button type="button" className="font-semibold underline" onClick={() => { setNotice(null); router.refresh(); }}>
                  Reload their version
                </button>
              ) : null}
            </p>
          </td>
        </tr>
      ) : null}
    </tbody>
  );
}

function displayOf<T>(field: FieldSpec<T>, row: T): ReactNode {
  const value = field.toInput(row);
  if (Array.isArray(value)) return value.map((v) => field.options?.find((o) => o.value === v)?.label ?? v).join(', ');
  if (field.kind === 'select') return field.options?.find((o) => o.value === value)?.label ?? value;
  return value === '' ? '—' : `${value}${field.suffix ? ` ${field.suffix}` : ''}`;
}

/** The locomotives of a consist, in order: remove one with ×, add one from the list. */
function ConsistPicker({
  id,
  label,
  value,
  onChange,
  options,
  invalid,
}: {
  id: string;
  label: string;
  value: string[];
  onChange: (v: string[]) => void;
  options: { value: string; label: string }[];
  invalid: boolean;
}) {
  const nameOf = (v: string) => options.find((o) => o.value === v)?.label ?? v;
  const left = options.filter((o) => !value.includes(o.value));
  return (
    <div className="flex min-w-56 flex-wrap items-center gap-1">
      {value.map((v) => (
        <span key={v} className="inline-flex items-center gap-1 rounded-full bg-verdigris-soft px-2 py-0.5 text-xs font-semibold text-verdigris-strong">
          {nameOf(v)}
          <button type="button" aria-label={`Take ${nameOf(v)} out of ${label}`} onClick={() => onChange(value.filter((x) => x !== v))}>
            ×
          </button>
        </span>
      ))}
      {left.length ? (
        <select
          id={id}
          aria-label={`Add a locomotive to ${label}`}
          aria-invalid={invalid || undefined}
          value=""
          onChange={(e) => e.target.value && onChange([...value, e.target.value])}
          className={`${inputClass} w-40`}
        >
          <option value="">{value.length ? '+ another' : '+ locomotive'}</option>
          {left.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      ) : null}
    </div>
  );
}
