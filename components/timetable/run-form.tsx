'use client';

import dynamic from 'next/dynamic';
import { useMemo, useState } from 'react';
import type { FastClock } from '@/lib/planning';
import { parseTimeOfDay } from '@/lib/planning/time-of-day';
import { routeThrough } from '@/lib/planning/route';
import { carryOnFrom } from '@/lib/sessions/carry-on';
import type { TimetableLayout } from '@/lib/sessions/types';
import type { CreateRunBody, Run } from '@/lib/runs/schema';
import { Button } from '@/components/ui/button';
import { Field, Select, TextInput } from '@/components/ui/field';

const STAND_BEFORE_S = '60';

// The drawing loads when the planner first opens it (the builder's first view stays light).
const TrackDiagram = dynamic(() => import('@/components/layouts/track-diagram').then((m) => m.TrackDiagram), {
  loading: () => <p className="text-sm text-muted">Loading the track diagram…</p>,
});

/**
 * Adds a run: train, cab, operator, a fast-clock departure, and a route picked by clicking blocks
 * in order (the first and last are enough: the shortest route between clicks is filled in).
 * It carries on: a train that already has runs starts where its last run stopped, at the first
 * fast minute after it, and after Add the form keeps its train, cab and operator and offers the
 * next run of the same train.
 */
export function RunForm({
  layout,
  runs,
  clock,
  suggestedDepart,
  onSubmit,
  pending,
}: {
  layout: TimetableLayout;
  /** The session's runs, to carry on from. */
  runs: readonly Run[];
  clock: FastClock;
  /** The departure offered for a train with no runs yet. */
  suggestedDepart: string;
  /** Adds the run; the run made, or null when it was not added. */
  onSubmit: (body: CreateRunBody, label: string) => Promise<Run | null>;
  pending: boolean;
}) {
  const firstTrain = layout.trains[0]?.id ?? '';
  const [initial] = useState(() => carryOnFrom(runs, firstTrain, clock, Number(STAND_BEFORE_S)));
  const [trainId, setTrainId] = useState(firstTrain);
  const [cabId, setCabId] = useState(layout.cabs[0]?.id ?? '');
  const [operatorId, setOperatorId] = useState('');
  const [depart, setDepart] = useState(initial?.depart ?? suggestedDepart);
  const [speed, setSpeed] = useState('50');
  const [standBefore, setStandBefore] = useState(STAND_BEFORE_S);
  const [standAfter, setStandAfter] = useState('120');
  const [waypoints, setWaypoints] = useState<string[]>(initial ? [initial.fromBlockId] : []);
  // The route start the form filled in itself (replaced when the train changes, kept once the planner picks on).
  const [prefilled, setPrefilled] = useState<string | null>(initial?.fromBlockId ?? null);
  const [added, setAdded] = useState<string | null>(null);
  const [diagramOpen, setDiagramOpen] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});

  /** Departure and route start carried on from a train's last run (or the plain suggestion). */
  const carryOn = (forTrain: string, among: readonly Run[]) => {
    const next = carryOnFrom(among, forTrain, clock, Number(standBefore) >= 0 ? Number(standBefore) : 0);
    setDepart(next?.depart ?? suggestedDepart);
    setWaypoints(next ? [next.fromBlockId] : []);
    setPrefilled(next?.fromBlockId ?? null);
    return next;
  };
  const chooseTrain = (id: string) => {
    setTrainId(id);
    // Only a route the form filled in (or none) is replaced: blocks the planner picked stay.
    if (waypoints.length === 0 || (waypoints.length === 1 && waypoints[0] === prefilled)) carryOn(id, runs);
  };

  const train = layout.trains.find((t) => t.id === trainId);
  const blockName = useMemo(() => new Map(layout.blocks.map((b) => [b.id, b.name])), [layout.blocks]);
  // The route a train can take without reversing (it may turn only at the ends or in a reversing place).
  const routed = useMemo(() => {
    const picked = waypoints.filter((id, i) => i === 0 || id !== waypoints[i - 1]);
    if (picked.length < 2) return { route: picked, reason: null };
    const found = routeThrough({ blocks: layout.blocks, links: layout.links }, picked);
    return found.ok ? { route: found.steps.map((s) => s.blockId), reason: null } : { route: null, reason: found.reason };
  }, [waypoints, layout.blocks, layout.links]);
  const route = routed.route;

  const submit = async () => {
    const next: Record<string, string> = {};
    if (!trainId) next.trainId = 'Choose a train.';
    if (!cabId) next.cabId = 'Choose a cab.';
    if (parseTimeOfDay(depart, { seconds: true }) === null) next.depart = 'Enter the departure as HH:MM on the fast clock, e.g. 06:45.';
    const speedKmh = Number(speed);
    if (!(speedKmh > 0 && speedKmh <= 500)) next.speedKmh = 'Enter a scale speed above 0 km/h.';
    else if (train?.topSpeedKmh && speedKmh > train.topSpeedKmh) next.speedKmh = `This train’s top speed is ${train.topSpeedKmh} km/h.`;
    const before = Number(standBefore);
    const after = Number(standAfter);
    if (!(before >= 0 && before <= 3600)) next.standBeforeS = 'Use 0 to 3600 s.';
    if (!(after >= 0 && after <= 3600)) next.standAfterS = 'Use 0 to 3600 s.';
    if (waypoints.length < 2) next.waypoints = 'Click at least the first and the last block.';
    else if (route === null) next.waypoints = `No route: ${routed.reason ?? 'no track joins the blocks you picked'}.`;
    else if (new Set(route).size < 2) next.waypoints = 'Pick two different blocks: a run has to go somewhere.';
    setErrors(next);
    if (Object.keys(next).length) return;
    const label = `${train?.name ?? 'run'} at ${depart.trim()}`;
    const made = await onSubmit(
      { trainId, cabId, operatorId: operatorId || null, depart: depart.trim(), waypoints, speedKmh, standBeforeS: before, standAfterS: after },
      label,
    );
    if (made) {
      // Carry on: the same train, cab and operator, from where this run stops, after it.
      const next = carryOn(made.trainId, [...runs.filter((r) => r.id !== made.id), made]);
      setAdded(
        next
          ? `Added ${label}. The next run of ${train?.name ?? 'this train'} can depart at ${next.depart} from ${blockName.get(next.fromBlockId) ?? 'where it stopped'}: pick where it goes.`
          : `Added ${label}.`,
      );
    }
  };

  return (
    <form
      className="space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
      data-testid="run-form"
    >
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="Train" name="run-train" error={errors.trainId}>
          <Select name="run-train" value={trainId} onChange={(e) => chooseTrain(e.target.value)}>
            {layout.trains.map((t) => (
              <option key={t.id} value={t.id}>{t.name}</option>
            ))}
          </Select>
        </Field>
        <Field label="Cab" name="run-cab" error={errors.cabId}>
          <Select name="run-cab" value={cabId} onChange={(e) => setCabId(e.target.value)}>
            {layout.cabs.map((c) => (
              <option key={c.id} value={c.id}>{c.name}</option>
            ))}
          </Select>
        </Field>
        <Field label="Operator" name="run-operator">
          <Select name="run-operator" value={operatorId} onChange={(e) => setOperatorId(e.target.value)}>
            <option value="">None yet</option>
            {layout.operators.map((o) => (
              <option key={o.id} value={o.id}>{o.name}{o.reply === 'declined' ? ' (declined)' : ''}</option>
            ))}
          </Select>
        </Field>
        <Field label="Departs (fast clock)" name="run-depart" error={errors.depart} hint="HH:MM on the fast clock">
          <TextInput name="run-depart" value={depart} onChange={(e) => setDepart(e.target.value)} inputMode="numeric" placeholder="06:45" />
        </Field>
        <Field label="Scale speed (km/h)" name="run-speed" error={errors.speedKmh} hint={train?.topSpeedKmh ? `Top speed ${train.topSpeedKmh} km/h` : undefined}>
          <TextInput name="run-speed" value={speed} onChange={(e) => setSpeed(e.target.value)} inputMode="decimal" />
        </Field>
        <Field label="Stands before departing (real s)" name="run-stand-before" error={errors.standBeforeS}>
          <TextInput name="run-stand-before" value={standBefore} onChange={(e) => setStandBefore(e.target.value)} inputMode="numeric" />
        </Field>
        <Field label="Stands after arriving (real s)" name="run-stand-after" error={errors.standAfterS}>
          <TextInput name="run-stand-after" value={standAfter} onChange={(e) => setStandAfter(e.target.value)} inputMode="numeric" />
        </Field>
      </div>
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Route</legend>
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="text-xs text-muted">
            Click the first and the last block; the shortest route between them is filled in. Click blocks in between to choose the way (a loop road, say).
          </p>
          <Button type="button" variant="secondary" aria-expanded={diagramOpen} onClick={() => setDiagramOpen((o) => !o)} data-testid="route-diagram-toggle">
            {diagramOpen ? 'Hide the track diagram' : 'Pick on the track diagram'}
          </Button>
        </div>
        {diagramOpen ? (
          <TrackDiagram
            title="Track diagram: click blocks in order to pick the route"
            idPrefix="route-diagram"
            blocks={layout.blocks}
            links={layout.links}
            picked={waypoints}
            route={route ?? []}
            onPick={(id) => setWaypoints((w) => [...w, id])}
          />
        ) : null}
        <div className="flex flex-wrap gap-1.5" role="group" aria-label="Blocks">
          {layout.blocks.map((b) => {
            const order = waypoints.indexOf(b.id);
            return (
              <button
                key={b.id}
                type="button"
                onClick={() => setWaypoints((w) => [...w, b.id])}
                aria-pressed={order >= 0}
                className={`rounded-full border px-2.5 py-1 text-xs ${order >= 0 ? 'border-verdigris bg-verdigris-soft font-semibold' : 'border-line hover:bg-sunken'}`}
                data-testid="route-block"
              >
                {order >= 0 ? `${order + 1}. ` : ''}
                {b.name}
              </button>
            );
          })}
        </div>
        <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="route-preview">
          {route && route.length ? (
            <span>{route.map((id) => blockName.get(id)).join(' → ')}</span>
          ) : (
            <span className="text-muted">No blocks picked yet.</span>
          )}
          {waypoints.length ? (
            <>
              <Button type="button" variant="ghost" onClick={() => setWaypoints((w) => w.slice(0, -1))}>Undo last block</Button>
              <Button type="button" variant="ghost" onClick={() => setWaypoints([])}>Clear</Button>
            </>
          ) : null}
        </div>
        {errors.waypoints ? <p className="text-sm text-signal" role="alert">{errors.waypoints}</p> : null}
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending}>{pending ? 'Saving…' : 'Add run'}</Button>
        <p className="text-sm text-muted" role="status" data-testid="run-form-status">{added}</p>
      </div>
    </form>
  );
}
