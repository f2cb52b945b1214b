'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { Fragment, useState, useTransition } from 'react';
import { useForm } from 'react-hook-form';
import { createLink, deleteLink } from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, Select } from '@/components/ui/field';
import { linkSchema } from '@/lib/validations/layout';
import { DataTable } from '@/components/ui/data-table';

type LinkRow = { id: string; a: string; b: string; aEnd: 'a' | 'b'; bEnd: 'a' | 'b' };
type End = 'a' | 'b';
const END_OPTIONS: { value: End; label: string }[] = [
  { value: 'a', label: 'end a' },
  { value: 'b', label: 'end b' },
];

/** Links between blocks: pick two blocks to join them; each block's neighbours show in the block table. */
export function LinksPanel({
  railwayId,
  layoutId,
  blocks,
  links,
  canEdit,
}: {
  railwayId: string;
  layoutId: string;
  blocks: { id: string; name: string }[];
  links: LinkRow[];
  canEdit: boolean;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [hiddenIds, setHiddenIds] = useState<Set<string>>(new Set());
  const form = useForm<{ blockAId: string; blockBId: string; blockAEnd: End; blockBEnd: End }>({
    resolver: zodResolver(linkSchema as never, undefined, { raw: true }) as never,
    defaultValues: { blockAId: '', blockBId: '', blockAEnd: 'b', blockBEnd: 'a' },
  });
  const errors = form.formState.errors;
  const add = form.handleSubmit((values) =>
    startTransition(async () => {
      const data = new FormData();
      data.set('blockAId', values.blockAId);
      data.set('blockBId', values.blockBId);
      data.set('blockAEnd', values.blockAEnd);
      data.set('blockBEnd', values.blockBEnd);
      const state = await createLink(railwayId, layoutId, null, data);
      if (state?.ok) {
        setMessage({ ok: true, text: state.message ?? 'Linked.' });
        // Keep the second block as the next link's first: lines are usually entered in order.
        form.reset({ blockAId: values.blockBId, blockBId: '', blockAEnd: 'b', blockBEnd: 'a' });
        router.refresh();
      } else if (state) {
        for (const [k, v] of Object.entries(state.fieldErrors ?? {})) form.setError(k as 'blockAId', { message: v });
        if (!Object.keys(state.fieldErrors ?? {}).length) setMessage({ ok: false, text: state.error });
      }
    }),
  );
  const remove = (id: string) =>
    startTransition(async () => {
      setHiddenIds((s) => new Set(s).add(id));
      const data = new FormData();
      data.set('id', id);
      const state = await deleteLink(railwayId, layoutId, null, data);
      if (state && !state.ok) {
        setHiddenIds((s) => {
          const n = new Set(s);
          n.delete(id);
          return n;
        });
        setMessage({ ok: false, text: state.error });
      } else router.refresh();
    });
  const visible = links.filter((l) => !hiddenIds.has(l.id));
  return (
    <div className="space-y-4">
      {canEdit ? (
        <form onSubmit={add} className="grid gap-3 sm:grid-cols-[1fr_auto_1fr_auto_auto] sm:items-end" noValidate>
          {(
            [
              ['blockAId', 'From block', 'blockAEnd', 'Its end'],
              ['blockBId', 'To block', 'blockBEnd', 'At its end'],
            ] as const
          ).map(([blockField, blockLabel, endField, endLabel]) => (
            <Fragment key={blockField}>
              <Field label={blockLabel} name={blockField} error={errors[blockField]?.message}>
                <Select {...form.register(blockField)} error={errors[blockField]?.message}>
                  <option value="">Choose…</option>
                  {blocks.map((b) => (
                    <option key={b.id} value={b.id}>
                      {b.name}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label={endLabel} name={endField} error={errors[endField]?.message}>
                <Select {...form.register(endField)} error={errors[endField]?.message}>
                  {END_OPTIONS.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </Select>
              </Field>
            </Fragment>
          ))}
          <Button type="submit" disabled={pending}>
            {pending ? 'Linking…' : 'Link'}
          </Button>
        </form>
      ) : null}
      {message ? <Notice tone={message.ok ? 'good' : 'bad'}>{message.text}</Notice> : null}
      <DataTable
        data={visible}
        label="links"
        testId="links-table"
        empty="No links yet."
        columns={[
          { id: 'a', header: 'Block', accessorFn: (l) => `${l.a} (end ${l.aEnd})` },
          { id: 'b', header: 'Joins', accessorFn: (l) => `${l.b} (end ${l.bEnd})` },
          ...(canEdit
            ? [
                {
                  id: 'actions',
                  header: '',
                  enableSorting: false,
                  cell: ({ row }: { row: { original: LinkRow } }) => (
                    <button
                      type="button"
                      className="rounded-plate border border-signal/40 px-3 py-1 text-sm font-semibold text-signal hover:bg-signal-soft"
                      aria-label={`Delete link ${row.original.a} — ${row.original.b}`}
                      onClick={() => remove(row.original.id)}
                    >
                      Delete
                    </button>
                  ),
                },
              ]
            : []),
        ]}
      />
    </div>
  );
}
