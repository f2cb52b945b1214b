'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { apiCall, errorMessage } from '@/lib/client/api';

/** The track-plan image, and for planners a way to upload or remove it (PNG, JPEG, WebP, ≤ 5 MB). */
export function TrackPlanPanel({ layoutId, version, hasImage, canEdit, name }: { layoutId: string; version: number; hasImage: boolean; canEdit: boolean; name: string }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const url = `/api/layouts/${layoutId}/track-plan`;
  const upload = (file: File | undefined) => {
    if (!file) return;
    startTransition(async () => {
      setMessage(null);
      const form = new FormData();
      form.set('version', String(version));
      form.set('file', file);
      try {
        await apiCall('POST', url, { body: { form } });
        setMessage({ ok: true, text: 'Track plan saved.' });
        router.refresh();
      } catch (error) {
        setMessage({ ok: false, text: errorMessage(error) });
      }
    });
  };
  const remove = () =>
    startTransition(async () => {
      try {
        await apiCall('DELETE', `${url}?version=${version}`);
        router.refresh();
      } catch (error) {
        setMessage({ ok: false, text: errorMessage(error) });
      }
    });
  return (
    <div className="space-y-3">
      {hasImage ? (
        // eslint-disable-next-line @next/next/no-img-element -- served through a members-only route, not /public
        <img src={`${url}?v=${version}`} alt={`Track plan of ${name}`} className="max-h-[28rem] w-full rounded-plate border border-line bg-sunken object-contain" data-testid="track-plan-image" />
      ) : (
        <p className="rounded-plate border border-dashed border-line p-6 text-center text-sm text-muted">No track plan yet.</p>
      )}
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <label className="text-sm font-semibold">
            {hasImage ? 'Replace the image' : 'Upload a track plan'}
            <input type="file" accept="image/png,image/jpeg,image/webp" disabled={pending} onChange={(e) => upload(e.target.files?.[0])} className="mt-1 block text-sm font-normal" aria-label="Track plan image" />
          </label>
          {hasImage ? (
            <Button type="button" variant="danger" onClick={remove} disabled={pending}>
              Remove image
            </Button>
          ) : null}
          <p className="w-full text-xs text-muted">PNG, JPEG or WebP up to 5 MB; the file&apos;s contents are checked, not its name.</p>
        </div>
      ) : null}
      {message ? <Notice tone={message.ok ? 'good' : 'bad'}>{message.text}</Notice> : null}
    </div>
  );
}
