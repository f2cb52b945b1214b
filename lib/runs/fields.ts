// Copying and restoring a run's fields: plain functions over the run's types, with no zod, so the
// builder's client can use them without the schemas (zod and the plan schema stay on the server).
import type { Run, RunAttributes, RunFields, RunTiming, UpdateRunBody } from './schema';

/** The fields of a run, for a copy or a put-back: everything but its id and version. */
export function runFieldsOf(run: Run): RunFields {
  const { id: _id, version: _version, ...fields } = run;
  return fields;
}

/** A run's attributes (everything but its identity and its timing), for an edit that puts them back. */
export function runAttributesOf(run: Run): RunAttributes {
  const { id: _id, version: _version, departS: _d, arriveS: _a, steps: _s, ...attributes } = run;
  return attributes;
}

/** The run moved by `deltaS` real seconds: departure, arrival and every step. */
export function shiftTiming(run: RunTiming, deltaS: number): RunTiming {
  return {
    departS: run.departS + deltaS,
    arriveS: run.arriveS + deltaS,
    steps: run.steps.map((s) => ({ ...s, enterS: s.enterS + deltaS, exitS: s.exitS + deltaS })),
  };
}

/** The edit that puts a run's every field back as it was in `before`, at the version it is at now. */
export function restoreEdit(before: Run, nowVersion: number): UpdateRunBody {
  return {
    version: nowVersion,
    ...runAttributesOf(before),
    steps: { departS: before.departS, arriveS: before.arriveS, steps: before.steps },
  };
}
