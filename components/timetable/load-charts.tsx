'use client';

import { CartesianGrid, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { Finding, HeatSeries, LoadProfile, LoadSeries } from '@/lib/planning';
import { niceTicks } from '@/lib/charts/nice-ticks';
import type { Highlight } from '@/lib/sessions/highlight';
import { fastLabel, realLabel, type SessionClock } from '@/lib/sessions/time-labels';

const amps = (v: number) => `${Math.round(v * 100) / 100} A`;
// Three decimals: a package rating such as 2075 mW (SLRS007B) must not read as rounded up.
const watts = (v: number) => `${Math.round(v * 1000) / 1000} W`;

const POWER_KINDS = new Set<Finding['kind']>(['channel-overload', 'channel-peak-overload', 'driver-overload', 'supply-overload', 'supply-derate', 'driver-heat']);

function SeriesChart({
  series,
  kind,
  overloads,
  clock,
  lengthS,
  marked,
  derate,
}: {
  series: LoadSeries;
  kind: 'cab' | 'driver' | 'supply';
  overloads: Finding[];
  clock: SessionClock;
  lengthS: number;
  marked: boolean;
  derate: number;
}) {
  const data = [{ t: 0, running: 0, peak: 0 }, ...series.points.map(([t, running, peak]) => ({ t, running, peak }))];
  const last = data[data.length - 1]!;
  if (last.t < lengthS) data.push({ t: lengthS, running: last.running, peak: last.peak });
  const ticks = niceTicks(Math.max(series.maxPeakAmps, series.limitAmps ?? 0, series.peakLimitAmps ?? 0) * 1.1);
  const top = ticks[ticks.length - 1]!;
  const over = overloads.length > 0;
  const currentOverloads = overloads.filter((f) => f.kind !== 'driver-heat');
  return (
    <figure
      className={`rounded-plate border p-3 ${marked ? 'border-brass bg-brass-soft' : over ? 'border-signal/50' : 'border-line'}`}
      data-testid="load-chart"
      data-series={series.id}
      data-overloaded={over ? 'true' : 'false'}
    >
      <figcaption className="mb-1 flex flex-wrap items-baseline justify-between gap-2 text-sm">
        <span className="font-semibold">{series.name}</span>
        <span className={over ? 'text-signal' : 'text-muted'}>
          peak {amps(series.maxPeakAmps)}, running {amps(series.maxRunningAmps)}
          {series.limitAmps !== null ? ` · rating ${amps(series.limitAmps)}` : ''}
          {kind === 'supply' && series.runningLimitAmps !== null ? ` · ${Math.round(derate * 100)} % ${amps(series.runningLimitAmps)}` : ''}
          {kind === 'cab' && series.surgeJudgedContinuous ? ' · surge judged against the rating' : ''}
        </span>
      </figcaption>
      <div className="h-36" data-ticks={ticks.join(' ')}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 4, right: 8, bottom: 0, left: -18 }}>
            <CartesianGrid stroke="var(--line)" strokeDasharray="2 4" />
            <XAxis
              dataKey="t"
              type="number"
              domain={[0, lengthS]}
              tickFormatter={(t: number) => fastLabel(t, clock)}
              tick={{ fontSize: 10, fill: 'var(--muted)' }}
              stroke="var(--line)"
            />
            <YAxis domain={[0, top]} ticks={ticks} interval={0} tick={{ fontSize: 10, fill: 'var(--muted)' }} stroke="var(--line)" tickFormatter={(v: number) => String(v)} />
            {currentOverloads.map((f) => (
              <ReferenceArea key={`${f.kind}${f.fromS}`} x1={f.fromS} x2={Math.max(f.toS, f.fromS + lengthS / 400)} fill="var(--signal)" fillOpacity={0.22} stroke="var(--signal)" strokeOpacity={0.6} />
            ))}
            {series.peakLimitAmps !== null && series.peakLimitAmps !== series.limitAmps ? (
              <ReferenceLine y={series.peakLimitAmps} stroke="var(--amber)" strokeDasharray="6 3" label={{ value: 'peak rating', fontSize: 10, fill: 'var(--amber)', position: 'insideTopRight' }} />
            ) : null}
            {series.limitAmps !== null ? (
              <ReferenceLine y={series.limitAmps} stroke="var(--signal)" label={{ value: 'rating', fontSize: 10, fill: 'var(--signal)', position: 'insideTopRight' }} />
            ) : null}
            {kind === 'supply' && series.runningLimitAmps !== null ? (
              <ReferenceLine y={series.runningLimitAmps} stroke="var(--brass)" strokeDasharray="4 4" label={{ value: 'derated', fontSize: 10, fill: 'var(--brass)', position: 'insideBottomLeft' }} />
            ) : null}
            <Line type="stepAfter" dataKey="peak" name="with start-up surge" stroke="var(--amber)" strokeWidth={1} dot={false} isAnimationActive={false} />
            <Line type="stepAfter" dataKey="running" name="running" stroke="var(--verdigris)" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Tooltip
              labelFormatter={(t) => `${fastLabel(Number(t), clock)} fast · ${realLabel(Number(t), clock)} real`}
              formatter={(v) => amps(Number(v))}
              contentStyle={{ background: 'var(--surface)', border: '1px solid var(--line)', fontSize: 12 }}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      {series.heat && series.heat.maxHighWatts > 0 ? (
        <HeatChart heat={series.heat} overloads={overloads.filter((f) => f.kind === 'driver-heat')} clock={clock} lengthS={lengthS} />
      ) : null}
    </figure>
  );
}

/** A driver's bridge dissipation (least to greatest drop) against its package rating. */
function HeatChart({ heat, overloads, clock, lengthS }: { heat: HeatSeries; overloads: Finding[]; clock: SessionClock; lengthS: number }) {
  const data = [{ t: 0, low: 0, high: 0 }, ...heat.points.map(([t, low, high]) => ({ t, low, high }))];
  const last = data[data.length - 1]!;
  if (last.t < lengthS) data.push({ t: lengthS, low: last.low, high: last.high });
  const top = Math.max(heat.maxHighWatts, heat.limitWatts ?? 0) * 1.15 || 1;
  return (
    <div className="mt-2 border-t border-line pt-2" data-testid="heat-chart">
      <p className="text-xs text-muted">
        Heat in the bridge: up to {watts(heat.maxLowWatts)}–{watts(heat.maxHighWatts)}
        {heat.limitWatts !== null ? ` · package rating ${watts(heat.limitWatts)}` : ' · no package rating entered'}
      </p>
      <div className="h-24">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 4, right: 8, bottom: 0, left: -18 }}>
            <CartesianGrid stroke="var(--line)" strokeDasharray="2 4" />
            <XAxis dataKey="t" type="number" domain={[0, lengthS]} tickFormatter={(t: number) => fastLabel(t, clock)} tick={{ fontSize: 10, fill: 'var(--muted)' }} stroke="var(--line)" />
            <YAxis domain={[0, top]} tick={{ fontSize: 10, fill: 'var(--muted)' }} stroke="var(--line)" tickFormatter={(v: number) => `${Math.round(v * 10) / 10}`} />
            {overloads.map((f) => (
              <ReferenceArea key={`${f.kind}${f.fromS}`} x1={f.fromS} x2={Math.max(f.toS, f.fromS + lengthS / 400)} fill="var(--signal)" fillOpacity={0.22} stroke="var(--signal)" strokeOpacity={0.6} />
            ))}
            {heat.limitWatts !== null ? (
              <ReferenceLine y={heat.limitWatts} stroke="var(--signal)" label={{ value: 'package', fontSize: 10, fill: 'var(--signal)', position: 'insideTopRight' }} />
            ) : null}
            <Line type="stepAfter" dataKey="high" name="greatest drop" stroke="var(--signal)" strokeWidth={1} dot={false} isAnimationActive={false} />
            <Line type="stepAfter" dataKey="low" name="least drop" stroke="var(--brass)" strokeWidth={2} dot={false} isAnimationActive={false} />
            <Tooltip
              labelFormatter={(t) => `${fastLabel(Number(t), clock)} fast · ${realLabel(Number(t), clock)} real`}
              formatter={(v) => watts(Number(v))}
              contentStyle={{ background: 'var(--surface)', border: '1px solid var(--line)', fontSize: 12 }}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </div>
  );
}

/**
 * Current over the session for every cab (channel), driver and supply against its rating, with the
 * derated limit for supplies; overload intervals are shaded.
 */
export function LoadCharts({
  load,
  findings,
  clock,
  lengthS,
  highlight,
  derate,
}: {
  load: LoadProfile;
  findings: Finding[];
  clock: SessionClock;
  lengthS: number;
  highlight?: Highlight;
  derate: number;
}) {
  const overloadsOf = (id: string) => findings.filter((f) => POWER_KINDS.has(f.kind) && f.ids[0] === id);
  const groups: { title: string; kind: 'cab' | 'driver' | 'supply'; series: LoadSeries[] }[] = [
    { title: 'Cabs (driver channels)', kind: 'cab', series: load.cabs },
    { title: 'Drivers', kind: 'driver', series: load.drivers },
    { title: 'Supplies', kind: 'supply', series: load.supplies },
  ];
  return (
    <div className="space-y-5" data-testid="load-view">
      <p className="rounded-plate bg-amber-soft px-3 py-2 text-sm text-amber">
        These figures are planning aids, not a substitute for the manufacturer&apos;s ratings, local codes or a licensed electrician.
        Fuse or current-limit every supply output; an overloaded supply or driver overheats, and driver heat sinks can reach burn temperatures.
      </p>
      <p className="text-xs text-muted">
        Green: running current. Amber: with each train&apos;s start-up surge (stall current scaled by the start voltage a PWM ramp reaches before
        the motor turns; full stall current where no start voltage is recorded). Below each driver: heat in the bridge, drop × current summed over
        its channels, with the least and the greatest drop the datasheet allows. Shaded: over a limit.
      </p>
      {groups.map((g) => (
        <section key={g.kind}>
          <h3 className="mb-2 font-display font-bold">{g.title}</h3>
          {g.series.length === 0 ? (
            <p className="text-sm text-muted">None on this layout.</p>
          ) : (
            <div className="grid gap-3 md:grid-cols-2">
              {g.series.map((s) => (
                <SeriesChart
                  key={s.id}
                  series={s}
                  kind={g.kind}
                  overloads={overloadsOf(s.id)}
                  clock={clock}
                  lengthS={lengthS}
                  derate={derate}
                  marked={g.kind === 'cab' ? Boolean(highlight?.cabIds.has(s.id)) : false}
                />
              ))}
            </div>
          )}
        </section>
      ))}
    </div>
  );
}
