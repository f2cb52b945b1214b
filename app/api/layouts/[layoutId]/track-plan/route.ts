import { updateLayoutById } from '@/db/queries/layouts';
import { recordAudit } from '@/db/queries/railways';
import { AppError, notFound, parseOrThrow, readMultipart } from '@/lib/errors';
import { handler } from '@/lib/http';
import { sniffImageType } from '@/lib/layouts/image-type';
import { requireLayoutById } from '@/lib/auth/layouts';
import { revalidateLayout, rowOrThrow } from '@/lib/layouts/layout-edits';
import { readTrackPlan, removeTrackPlan, storeTrackPlan } from '@/lib/layouts/track-plan-store';
import { IMAGE_MAX_BYTES } from '@/lib/validations/layout';
import { trackPlanParamsSchema, trackPlanVersionSchema } from './schema';

type Params = { layoutId: string };
const tooLarge = () => new AppError('too_large', 'The image is over 5 MB; the limit is 5 MB. Save it smaller and try again.');

/** Any member: the layout's track-plan image, with the type its bytes showed at upload. */
const serveTrackPlan = handler<Params>(async (_request, { params }) => {
  const { layoutId } = parseOrThrow(trackPlanParamsSchema, await params);
  const { layout } = await requireLayoutById(layoutId, 'operator');
  const bytes = layout.trackPlanFile ? readTrackPlan(layout.trackPlanFile) : null;
  if (!bytes || !layout.trackPlanType) throw notFound('The track plan');
  return new Response(new Uint8Array(bytes), {
    headers: {
      'Content-Type': layout.trackPlanType,
      'Content-Length': String(bytes.length),
      'X-Content-Type-Options': 'nosniff',
      'Content-Security-Policy': "default-src 'none'",
      'Cache-Control': 'private, max-age=300',
    },
  });
});

/**
 * Planner or host: uploads a track plan (multipart field `file`, plus the layout `version` seen).
 * PNG, JPEG or WebP by content, whatever the name says; up to 5 MB; replaces the previous image.
 */
const uploadTrackPlan = handler<Params>(async (request, { params }) => {
  const { layoutId } = parseOrThrow(trackPlanParamsSchema, await params);
  const { member, layout } = await requireLayoutById(layoutId, 'planner', 'change track plans');
  // The image plus room for the form's boundaries and the version field, counted as it streams in.
  const form = await readMultipart(request, {
    maxBytes: IMAGE_MAX_BYTES + 64_000,
    wrongType: 'Send the image as a form upload (multipart/form-data) with the field “file”.',
    tooLarge,
  });
  const { version } = parseOrThrow(trackPlanVersionSchema, { version: form.get('version') });
  const file = form.get('file');
  if (!(file instanceof Blob) || file.size === 0) {
    throw new AppError('bad_request', 'Choose an image file.', { issues: [{ path: 'file', message: 'Choose an image file.' }] });
  }
  if (file.size > IMAGE_MAX_BYTES) throw tooLarge();
  const bytes = new Uint8Array(await file.arrayBuffer());
  const type = sniffImageType(bytes);
  if (!type) {
    const message = 'This file is not a PNG, JPEG or WebP image (its contents were checked, not its name).';
    throw new AppError('bad_request', message, { issues: [{ path: 'file', message }] });
  }
  const name = storeTrackPlan(bytes, type);
  const result = updateLayoutById(member.railwayId, layout.id, version, { trackPlanFile: name, trackPlanType: type });
  if (!result.ok) removeTrackPlan(name);
  const saved = rowOrThrow(result, 'That layout');
  removeTrackPlan(layout.trackPlanFile);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'upload-track-plan', entity: 'layout', entityId: layout.id, detail: { type, bytes: bytes.length } });
  revalidateLayout(member.railwayId, layout.id);
  return Response.json({ version: saved.version, type });
});

/** Planner or host: removes the track plan (`?version=` the layout version seen). */
const removeTrackPlanImage = handler<Params>(async (request, { params }) => {
  const { layoutId } = parseOrThrow(trackPlanParamsSchema, await params);
  const { member, layout } = await requireLayoutById(layoutId, 'planner', 'change track plans');
  const { version } = parseOrThrow(trackPlanVersionSchema, { version: new URL(request.url).searchParams.get('version') });
  if (!layout.trackPlanFile) throw notFound('The track plan');
  const saved = rowOrThrow(updateLayoutById(member.railwayId, layout.id, version, { trackPlanFile: null, trackPlanType: null }), 'That layout');
  removeTrackPlan(layout.trackPlanFile);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'remove-track-plan', entity: 'layout', entityId: layout.id });
  revalidateLayout(member.railwayId, layout.id);
  return Response.json({ version: saved.version });
});

export { serveTrackPlan as GET, uploadTrackPlan as POST, removeTrackPlanImage as DELETE };
